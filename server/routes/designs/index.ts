import { Router } from "express";
import { z } from "zod";
import { CreateDesignSchema } from "../../../shared/schemas/designs";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { createDesign, getDesign, listDesigns } from "../../services/designs";
import { createRevision, getRevision } from "../../services/revisions";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** `:projectId` of the routes nested under a project. */
export const ProjectIdParamSchema = z.object({
  projectId: z.coerce.number().int().positive("must be a positive integer"),
});

/** /api/projects/:projectId/designs: list and create. */
export function projectDesignRoutes(ctx: RouteContext): Router {
  const r = Router({ mergeParams: true });
  r.use(requireUser);
  r.get("/", async (req, res) => {
    const { projectId } = parseInput(ProjectIdParamSchema, req.params);
    res.json({ designs: await listDesigns(ctx.db, currentUser(req), projectId) });
  });
  r.post("/", requireRole("author"), async (req, res) => {
    const { projectId } = parseInput(ProjectIdParamSchema, req.params);
    const input = parseInput(CreateDesignSchema, req.body);
    res.status(201).json(await createDesign(ctx.db, currentUser(req), projectId, input));
  });
  return r;
}

/** /api/designs/:id and its new-revision action. */
export function designRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser);
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await getDesign(ctx.db, currentUser(req), id));
  });
  r.post("/:id/revisions", requireRole("author"), async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const user = currentUser(req);
    const revisionId = await createRevision(ctx.db, user, id);
    const detail = await getRevision(ctx.db, user, revisionId);
    res.status(201).json({ revision: detail.revision });
  });
  return r;
}
