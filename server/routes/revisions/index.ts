import { Router } from "express";
import { z } from "zod";
import { UpdateRevisionSchema } from "../../../shared/schemas/designs";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { getRevision, tableValues, updateRevision } from "../../services/revisions";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

const TableParamSchema = IdParamSchema.extend({
  tableId: z.coerce.number().int().positive("must be a positive integer"),
});

/** /api/revisions/:id: read, edit a draft, download a table's values (submit lives with the lifecycle routes). */
export function revisionRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser);
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await getRevision(ctx.db, currentUser(req), id));
  });
  r.patch("/:id", requireRole("author"), async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { content } = parseInput(UpdateRevisionSchema, req.body);
    res.json(await updateRevision(ctx.db, currentUser(req), id, content));
  });
  r.get("/:id/tables/:tableId/values", async (req, res) => {
    const { id, tableId } = parseInput(TableParamSchema, req.params);
    const t = await tableValues(ctx.db, currentUser(req), id, tableId);
    res.setHeader("Content-Type", "application/octet-stream");
    res.setHeader("X-Values-SHA256", t.sha256);
    res.setHeader("Content-Disposition", `attachment; filename="revision-${id}-${t.role}.f64le"`);
    res.send(t.values);
  });
  return r;
}
