import { Router } from "express";
import { z } from "zod";
import { requireRole } from "../../auth/guards";
import { HttpError, parseInput } from "../../http/errors";
import { getSinkMessage, listSinkMessages } from "../../mail/mailbox";
import { outboxCounts } from "../../mail/outbox";
import { runningSinkPort } from "../../mail/runtime";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

const ListQuerySchema = z.strictObject({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** The SMTP sink's mailbox, admin only and read-only. */
export function mailboxRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireRole("admin"));
  r.get("/", async (req, res) => {
    const page = await listSinkMessages(ctx.db, parseInput(ListQuerySchema, req.query));
    res.json({ ...page, sinkPort: runningSinkPort(), outbox: await outboxCounts(ctx.db) });
  });
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const message = await getSinkMessage(ctx.db, id);
    if (!message) throw new HttpError("not_found", "No such message in the mailbox");
    res.json({ message });
  });
  return r;
}
