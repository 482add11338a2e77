import { and, asc, eq, inArray, lte, sql } from "drizzle-orm";
import type { MailTemplateName } from "../../shared/schemas/mail";
import type { Db } from "../db/client";
import { mailOutbox } from "../db/schema";
import type { Executor } from "../services/audit";
import { mailTemplates, type MailData, type MailTemplates } from "./templates";

/** A mail to enqueue: a template, its data and one or more addresses. */
export interface MailRequest<T extends MailTemplateName> {
  template: T;
  to: readonly string[];
  data: MailData[T];
}

/**
 * Render a template and insert the message into the outbox in the caller's transaction. Returns the row
 * id, or null when there is nobody to send to. Sending happens later in the dispatcher, so an SMTP
 * failure can never undo the caller's change.
 */
export async function enqueueMail<T extends MailTemplateName>(
  tx: Executor,
  req: MailRequest<T>,
  templates: MailTemplates = mailTemplates(),
): Promise<number | null> {
  const to = [...new Set(req.to.map((a) => a.trim()).filter((a) => a.length > 0))];
  if (to.length === 0) return null;
  const rendered = await templates.render(req.template, req.data);
  const [row] = await tx
    .insert(mailOutbox)
    .values({ toAddresses: to, template: req.template, ...rendered })
    .returning({ id: mailOutbox.id });
  if (!row) throw new Error("outbox insert returned no row");
  return row.id;
}

/** A claimed outbox row, as the dispatcher sends it. */
export type OutboxRow = typeof mailOutbox.$inferSelect;

/**
 * Claim up to `limit` due rows: count the attempt and push next_attempt_at out by `leaseSeconds`, so a
 * second dispatcher (another web replica) skips them while this one sends. SKIP LOCKED keeps claims apart.
 */
export async function claimDue(db: Db, limit: number, leaseSeconds: number): Promise<OutboxRow[]> {
  return db.transaction(async (tx) => {
    const due = await tx
      .select({ id: mailOutbox.id })
      .from(mailOutbox)
      .where(and(eq(mailOutbox.status, "pending"), lte(mailOutbox.nextAttemptAt, sql`now()`)))
      .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (due.length === 0) return [];
    return tx
      .update(mailOutbox)
      .set({
        attempts: sql`${mailOutbox.attempts} + 1`,
        nextAttemptAt: sql`now() + make_interval(secs => ${leaseSeconds})`,
      })
      .where(
        inArray(
          mailOutbox.id,
          due.map((d) => d.id),
        ),
      )
      .returning();
  });
}

/** Mark a claimed row as delivered to the SMTP server. */
export async function markSent(db: Db, id: number): Promise<void> {
  await db
    .update(mailOutbox)
    .set({ status: "sent", sentAt: sql`now()`, lastError: null })
    .where(eq(mailOutbox.id, id));
}

/** Record a failed attempt: retry after `retryInSeconds`, or give up as failed. */
export async function markAttemptFailed(
  db: Db,
  id: number,
  error: string,
  retryInSeconds: number | null,
): Promise<void> {
  await db
    .update(mailOutbox)
    .set(
      retryInSeconds === null
        ? { status: "failed", lastError: error }
        : { lastError: error, nextAttemptAt: sql`now() + make_interval(secs => ${retryInSeconds})` },
    )
    .where(eq(mailOutbox.id, id));
}

/** Counts per status (admin home, health). */
export async function outboxCounts(db: Db): Promise<Record<"pending" | "sent" | "failed", number>> {
  const rows = await db
    .select({ status: mailOutbox.status, n: sql<number>`count(*)::int` })
    .from(mailOutbox)
    .groupBy(mailOutbox.status);
  const out = { pending: 0, sent: 0, failed: 0 };
  for (const r of rows) out[r.status] = r.n;
  return out;
}
