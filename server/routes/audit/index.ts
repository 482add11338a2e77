import { Router } from "express";
import { AuditFilterSchema, AuditPageQuerySchema } from "../../../shared/schemas/audit";
import { requireRole } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { auditActions, iterateAudit, listAudit } from "../../services/audit";
import type { RouteContext } from "../context";
import { AUDIT_CSV_HEADER, auditCsvRecord, csvRecord } from "./csv";

/** The audit trail, admin only and read-only: there is deliberately no route that changes a row. */
export function auditRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireRole("admin"));
  r.get("/", async (req, res) => {
    const q = parseInput(AuditPageQuerySchema, req.query);
    res.json(await listAudit(ctx.db, q));
  });
  r.get("/actions", async (_req, res) => {
    res.json({ actions: await auditActions(ctx.db) });
  });
  return r;
}

/** GET /api/admin/audit.csv: the same filters as the page, every matching row, streamed. */
export function auditCsvRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireRole("admin"));
  r.get("/", async (req, res) => {
    const f = parseInput(AuditFilterSchema, req.query);
    const stamp = new Date().toISOString().replace(/[:.]/g, "-");
    res.setHeader("Content-Type", "text/csv; charset=utf-8; header=present");
    res.setHeader("Content-Disposition", `attachment; filename="tapwright-audit-${stamp}.csv"`);
    res.setHeader("Cache-Control", "no-store");
    res.write(csvRecord(AUDIT_CSV_HEADER));
    for await (const e of iterateAudit(ctx.db, f)) res.write(auditCsvRecord(e));
    res.end();
  });
  return r;
}
