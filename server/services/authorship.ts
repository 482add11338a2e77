/**
 * Who wrote a revision's content (separation of duties by authorship): every write of revision content records
 * its writer here, in the same transaction, and the lifecycle table refuses an approval by any of them.
 */
import { eq, inArray, sql } from "drizzle-orm";
import type { RevisionContent } from "../../shared/schemas/designs";
import type { Db } from "../db/client";
import { revisionAuthors, uploads } from "../db/schema";
import type { Tx } from "./designs";
import { uploadIdsOf } from "./materialize";

/**
 * Record the writers of a content write: the user who wrote it and the uploaders of every file it uses (their
 * bytes are part of the coefficients). Idempotent.
 */
export async function recordContentAuthors(
  tx: Tx,
  revisionId: number,
  writerId: number,
  content: RevisionContent,
): Promise<void> {
  const ids = uploadIdsOf(content);
  const uploaders =
    ids.length === 0
      ? []
      : await tx.select({ id: uploads.uploadedById }).from(uploads).where(inArray(uploads.id, ids));
  const userIds = [...new Set([writerId, ...uploaders.map((u) => u.id)])];
  await tx
    .insert(revisionAuthors)
    .values(userIds.map((userId) => ({ revisionId, userId })))
    .onConflictDoNothing();
}

/** A revision started from another carries its content over, and with it the other's authors. */
export async function inheritContentAuthors(
  tx: Tx,
  fromRevisionId: number,
  toRevisionId: number,
): Promise<void> {
  await tx.execute(sql`
    insert into ${revisionAuthors} (revision_id, user_id, first_at)
    select ${toRevisionId}, user_id, first_at from ${revisionAuthors} where revision_id = ${fromRevisionId}
    on conflict do nothing`);
}

/** The ids of everyone who wrote any of the revision's content. */
export async function contentAuthorIds(db: Db | Tx, revisionId: number): Promise<number[]> {
  const rows = await db
    .select({ userId: revisionAuthors.userId })
    .from(revisionAuthors)
    .where(eq(revisionAuthors.revisionId, revisionId));
  return rows.map((r) => r.userId);
}

/** Content authors of several revisions at once. */
export async function contentAuthorsOf(
  db: Db | Tx,
  revisionIds: number[],
): Promise<Map<number, Set<number>>> {
  const out = new Map<number, Set<number>>(revisionIds.map((id) => [id, new Set()]));
  if (revisionIds.length === 0) return out;
  const rows = await db
    .select()
    .from(revisionAuthors)
    .where(inArray(revisionAuthors.revisionId, revisionIds));
  for (const r of rows) out.get(r.revisionId)?.add(r.userId);
  return out;
}
