import { Router } from "express";
import { currentUser } from "../../auth/guards";
import { homeFor } from "../../services/home";
import type { RouteContext } from "../context";

/** GET /api/home: the start page for the signed-in user. */
export function homeRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/", async (req, res) => {
    res.json(await homeFor(ctx.db, currentUser(req), ctx.version));
  });
  return r;
}
