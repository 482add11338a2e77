import { Router } from "express";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { hasLiveJob, senderFor, sendAnalysis } from "../../jobs/queue";
import { renderReportHtml } from "../../reports/render-html";
import { getAnalysis, getReportDocument, requestAnalysis } from "../../services/analyses";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** /api/revisions/:id/analysis and the report downloads (JSON, printable HTML). */
export function analysisRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser);
  r.post("/:id/analysis", requireRole("author", "reviewer"), async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const analysis = await requestAnalysis(ctx.db, currentUser(req), id, {
      send: async (data) => sendAnalysis(await senderFor(ctx.db), data),
      // Starting the sender creates pg-boss's schema, so it comes first.
      isLive: async (hash) => {
        await senderFor(ctx.db);
        return hasLiveJob(ctx.db, hash);
      },
    });
    res.status(202).json({ analysis });
  });
  r.get("/:id/analysis", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.setHeader("Cache-Control", "no-store");
    res.json({ analysis: await getAnalysis(ctx.db, currentUser(req), id) });
  });
  r.get("/:id/report.json", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const doc = await getReportDocument(ctx.db, currentUser(req), id);
    res.setHeader("Content-Disposition", `inline; filename="revision-${id}-report.json"`);
    res.json(doc);
  });
  r.get("/:id/report.html", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const doc = await getReportDocument(ctx.db, currentUser(req), id);
    // Self-contained page: only its own inline style, nothing else may load.
    res.setHeader(
      "Content-Security-Policy",
      "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
    );
    res.type("html").send(renderReportHtml(doc.header, doc.report));
  });
  return r;
}
