import { desc, eq, lt } from "drizzle-orm";
import type { SinkMessage, SinkMessageSummary } from "../../shared/schemas/mail";
import type { Db } from "../db/client";
import { mailSinkMessages } from "../db/schema";

const summary = {
  id: mailSinkMessages.id,
  receivedAt: mailSinkMessages.receivedAt,
  envelopeFrom: mailSinkMessages.envelopeFrom,
  envelopeTo: mailSinkMessages.envelopeTo,
  subject: mailSinkMessages.subject,
};

/** Sink messages, newest first, keyset paged on id (`before` = the last id of the previous page). */
export async function listSinkMessages(
  db: Db,
  q: { before?: number; limit: number },
): Promise<{ messages: SinkMessageSummary[]; nextBefore: number | null }> {
  const rows = await db
    .select(summary)
    .from(mailSinkMessages)
    .where(q.before !== undefined ? lt(mailSinkMessages.id, q.before) : undefined)
    .orderBy(desc(mailSinkMessages.id))
    .limit(q.limit + 1);
  const messages = rows.slice(0, q.limit).map((r) => ({ ...r, receivedAt: r.receivedAt.toISOString() }));
  const last = messages.at(-1);
  return { messages, nextBefore: rows.length > q.limit && last ? last.id : null };
}

/** One sink message with its bodies (never the raw source: that stays in the database for debugging). */
export async function getSinkMessage(db: Db, id: number): Promise<SinkMessage | undefined> {
  const [row] = await db
    .select({
      ...summary,
      messageId: mailSinkMessages.messageId,
      text: mailSinkMessages.text,
      html: mailSinkMessages.html,
    })
    .from(mailSinkMessages)
    .where(eq(mailSinkMessages.id, id));
  return row ? { ...row, receivedAt: row.receivedAt.toISOString() } : undefined;
}
