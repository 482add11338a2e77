import { Router } from "express";
import { ReleaseListQuerySchema, WithdrawReleaseSchema } from "../../../shared/schemas/releases";
import { currentUser, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import {
  designReleases,
  getRelease,
  listReleases,
  suggestVersions,
  withdrawRelease,
} from "../../services/releases";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** /api/releases: list (my projects), one release, withdraw. */
export function releaseRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/", requireUser, async (req, res) => {
    const q = parseInput(ReleaseListQuerySchema, req.query);
    res.json({ releases: await listReleases(ctx.db, currentUser(req), q) });
  });
  r.get("/:id", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ release: await getRelease(ctx.db, currentUser(req), id) });
  });
  r.post("/:id/withdraw", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { reason } = parseInput(WithdrawReleaseSchema, req.body);
    res.json({ release: await withdrawRelease(ctx.db, currentUser(req), id, reason) });
  });
  return r;
}

/** /api/designs/:id/{releases,next-versions} */
export function designReleaseRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/:id/releases", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ releases: await designReleases(ctx.db, currentUser(req), id) });
  });
  r.get("/:id/next-versions", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await suggestVersions(ctx.db, currentUser(req), id));
  });
  return r;
}
