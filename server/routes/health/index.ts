import { Router } from "express";
import { checkHealth } from "../../services/health";
import type { RouteContext } from "../context";

/** GET /api/health: no sign-in needed; 503 when the database does not answer. */
export function healthRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/", async (_req, res) => {
    const health = await checkHealth(ctx.db, ctx.version);
    res.status(health.database.ok ? 200 : 503).json(health);
  });
  return r;
}
