import { Router, type Request } from "express";
import { z } from "zod";
import { VersionSchema } from "../../../shared/schemas/releases";
import { currentUser, requireUser } from "../../auth/guards";
import { sendBundle } from "../../bundles/download";
import { parseInput } from "../../http/errors";
import { getRelease, releaseByVersion } from "../../services/releases";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** /api/releases/:id/bundle: the stored zip, checked against its SHA-256 (session or bearer token). */
export function releaseDownloadRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/:id/bundle", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    await sendBundle(ctx.db, req, res, await getRelease(ctx.db, currentUser(req), id));
  });
  return r;
}

const ByVersionParamsSchema = z.object({
  slug: z.string().min(1),
  designName: z.string().min(1).max(120),
  version: z.union([z.literal("latest"), VersionSchema]),
});

/** /api/projects/:slug/designs/:designName/releases/:version|latest[/bundle], for build scripts. */
export function projectReleaseDownloadRoutes(ctx: RouteContext): Router {
  const r = Router({ mergeParams: true });
  const find = (req: Request) => {
    const p = parseInput(ByVersionParamsSchema, req.params);
    return releaseByVersion(ctx.db, currentUser(req), p.slug, p.designName, p.version);
  };
  r.get("/:version", requireUser, async (req, res) => {
    const release = await find(req);
    // "latest" moves when a release is made or withdrawn: never cache it.
    res.setHeader("Cache-Control", "no-store");
    res.json({ release });
  });
  r.get("/:version/bundle", requireUser, async (req, res) => {
    await sendBundle(ctx.db, req, res, await find(req));
  });
  return r;
}
