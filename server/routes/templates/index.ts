import { Router } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { z } from "zod";
import {
  CreateTemplateSchema,
  PreviewRequestSchema,
  UpdateTemplateSchema,
} from "../../../shared/exports/schemas";
import { currentUser, requireRole } from "../../auth/guards";
import { HttpError, parseInput } from "../../http/errors";
import {
  createTemplate,
  getTemplate,
  listTemplates,
  previewTemplate,
  updateTemplate,
} from "../../services/templates";
import type { RouteContext } from "../context";

/** Built-in word ids or custom row ids. */
const TemplateIdSchema = z.object({
  id: z.string().regex(/^(?:\d{1,9}|[a-z][a-z0-9-]{0,39})$/, "not a template id"),
});

/** Options of the template routes (tests lower the preview limit). */
export interface TemplateRouteOptions {
  /** Preview renders allowed per minute per user. */
  previewsPerMinute?: number;
}

/** Export templates: authors and admins read, admins write and preview. */
export function templateRoutes(ctx: RouteContext, opts: TemplateRouteOptions = {}): Router {
  const r = Router();
  r.use(requireRole("admin", "author"));
  // Each keystroke pause in the editor renders once; 120 a minute is ample for a person, not for a loop.
  const previewLimiter = rateLimit({
    windowMs: 60_000,
    limit: opts.previewsPerMinute ?? 120,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    keyGenerator: (req) => (req.user ? `user:${req.user.id}` : ipKeyGenerator(req.ip ?? "")),
    handler: (_req, _res, next) =>
      next(new HttpError("rate_limited", "Too many previews; wait a few seconds and try again")),
  });

  r.get("/", async (_req, res) => {
    res.json({ templates: await listTemplates(ctx.db) });
  });
  r.post("/preview", requireRole("admin"), previewLimiter, async (req, res) => {
    const input = parseInput(PreviewRequestSchema, req.body);
    res.json(await previewTemplate(input.body, input.sample));
  });
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(TemplateIdSchema, req.params);
    res.json({ template: await getTemplate(ctx.db, id) });
  });
  r.post("/", requireRole("admin"), async (req, res) => {
    const input = parseInput(CreateTemplateSchema, req.body);
    res.status(201).json({ template: await createTemplate(ctx.db, currentUser(req).id, input) });
  });
  r.patch("/:id", requireRole("admin"), async (req, res) => {
    const { id } = parseInput(TemplateIdSchema, req.params);
    const input = parseInput(UpdateTemplateSchema, req.body);
    res.json({ template: await updateTemplate(ctx.db, currentUser(req).id, id, input) });
  });
  return r;
}
