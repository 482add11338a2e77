import { Router } from "express";
import { ReleaseDiffQuerySchema } from "../../../shared/schemas/release-diff";
import { currentUser, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { releaseDiff } from "../../services/release-diff";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** /api/releases/:id/diff?against=:otherId: spec, coefficient (LSB) and metric changes between two releases. */
export function releaseDiffRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/:id/diff", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { against } = parseInput(ReleaseDiffQuerySchema, req.query);
    res.json({ diff: await releaseDiff(ctx.db, currentUser(req), id, against) });
  });
  return r;
}
