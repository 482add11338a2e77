import { and, asc, desc, eq, sql } from "drizzle-orm";
import type {
  CoefficientTable,
  RevisionContent,
  RevisionDetail,
  RevisionState,
} from "../../shared/schemas/designs";
import type { Db } from "../db/client";
import { coefficientTables, designs, revisions } from "../db/schema";
import { HttpError, validationFailed } from "../http/errors";
import { contentHash } from "./content-hash";
import { canAuthor, insertTables, revisionSummaries, tablesFor, visibleDesign, type Tx } from "./designs";
import { uploadIdsOf } from "./materialize";
import type { Viewer } from "./projects";
import { recordAudit } from "./audit";
import { inheritContentAuthors, recordContentAuthors } from "./authorship";
import { STATE_WORDS } from "./lifecycle";
import { revisionFacts, submitInTx } from "./reviews";
import { uploadsByIds } from "./uploads";

/** The 409 for any change to a revision past draft. */
function frozen(number: number, state: RevisionState): HttpError {
  return new HttpError(
    "conflict",
    `r${number} is ${STATE_WORDS[state]} and cannot change: start a new revision`,
    {
      state,
    },
  );
}

async function revisionRow(db: Db | Tx, id: number, lock = false) {
  const q = db
    .select({
      id: revisions.id,
      designId: revisions.designId,
      number: revisions.number,
      state: revisions.state,
      content: revisions.content,
    })
    .from(revisions)
    .where(eq(revisions.id, id));
  const [row] = lock ? await q.for("update") : await q;
  return row;
}

/** A revision the viewer may see (404 otherwise), with its design and project. */
async function visibleRevision(db: Db, viewer: Viewer, id: number) {
  const row = await revisionRow(db, id);
  if (!row) throw new HttpError("not_found", "No such revision");
  const { design, project } = await visibleDesign(db, viewer, row.designId).catch((e: unknown) => {
    throw e instanceof HttpError && e.code === "not_found"
      ? new HttpError("not_found", "No such revision")
      : e;
  });
  return { row, design, project };
}

/** GET /api/revisions/:id */
export async function getRevision(db: Db, viewer: Viewer, id: number): Promise<RevisionDetail> {
  const { row, design, project } = await visibleRevision(db, viewer, id);
  const [summary] = await revisionSummaries(db, eq(revisions.id, id));
  if (!summary) throw new HttpError("not_found", "No such revision");
  const { designId: _omit, ...revision } = summary;
  const content = row.content as RevisionContent;
  const tables = await db
    .select({
      id: coefficientTables.id,
      role: coefficientTables.role,
      complex: coefficientTables.complex,
      length: coefficientTables.length,
      sampleRateHz: coefficientTables.sampleRateHz,
      source: coefficientTables.source,
      valuesSha256: coefficientTables.valuesSha256,
    })
    .from(coefficientTables)
    .where(eq(coefficientTables.revisionId, id))
    .orderBy(asc(coefficientTables.position));
  return {
    revision,
    design,
    project,
    content,
    tables: tables.map((t) => ({ ...t, source: t.source as CoefficientTable["source"] })),
    uploads: await uploadsByIds(db, project.id, uploadIdsOf(content)),
    canEdit: canAuthor(viewer) && row.state === "draft",
  };
}

const isUniqueViolation = (e: unknown): boolean =>
  typeof e === "object" &&
  e !== null &&
  ((e as { code?: string }).code === "23505" || isUniqueViolation((e as { cause?: unknown }).cause));

/** A new draft copied (content and tables) from the design's latest revision; 409 if a draft exists. */
export async function createRevision(db: Db, viewer: Viewer, designId: number): Promise<number> {
  const { project } = await visibleDesign(db, viewer, designId);
  const draftExists = (id: number | undefined) =>
    new HttpError("conflict", "This design already has a draft: edit it instead", { revisionId: id });
  const findDraft = async (h: Db | Tx = db) =>
    (
      await h
        .select({ id: revisions.id })
        .from(revisions)
        .where(and(eq(revisions.designId, designId), eq(revisions.state, "draft")))
    )[0]?.id;
  try {
    return await db.transaction(async (tx) => {
      // Serialize "new revision" per design so numbers stay dense.
      await tx.select({ id: designs.id }).from(designs).where(eq(designs.id, designId)).for("update");
      const [latest] = await tx
        .select({
          id: revisions.id,
          number: revisions.number,
          state: revisions.state,
          content: revisions.content,
        })
        .from(revisions)
        .where(eq(revisions.designId, designId))
        .orderBy(desc(revisions.number))
        .limit(1);
      if (!latest) throw new Error(`design ${designId} has no revision`);
      const draft = await findDraft(tx);
      if (draft !== undefined) throw draftExists(draft);
      const [created] = await tx
        .insert(revisions)
        .values({
          designId,
          number: latest.number + 1,
          content: latest.content,
          createdById: viewer.id,
          parentRevisionId: latest.id,
        })
        .returning({ id: revisions.id });
      if (!created) throw new Error("revision insert returned no row");
      // Copy the stored bytes in the database rather than through the app.
      await tx.execute(sql`
        insert into ${coefficientTables} (revision_id, role, position, complex, length, sample_rate_hz, source, values, values_sha256)
        select ${created.id}, role, position, complex, length, sample_rate_hz, source, values, values_sha256
        from ${coefficientTables} where revision_id = ${latest.id}`);
      await inheritContentAuthors(tx, latest.id, created.id);
      await recordContentAuthors(tx, created.id, viewer.id, latest.content as RevisionContent);
      await tx.update(designs).set({ updatedAt: new Date() }).where(eq(designs.id, designId));
      await recordAudit(tx, {
        action: "revision.create",
        projectId: project.id,
        subjectType: "revision",
        subjectId: created.id,
        summary: `Started r${latest.number + 1} of design ${designId} from r${latest.number}`,
        details: { designId, number: latest.number + 1, parentRevisionId: latest.id },
      });
      return created.id;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw draftExists(await findDraft());
    throw e;
  }
}

/** Replace a draft's content and re-materialize its tables. */
export async function updateRevision(
  db: Db,
  viewer: Viewer,
  id: number,
  content: RevisionContent,
): Promise<RevisionDetail> {
  const { row, design, project } = await visibleRevision(db, viewer, id);
  if (row.state !== "draft") throw frozen(row.number, row.state);
  if (content.kind !== design.kind)
    throw validationFailed([{ path: ["content", "kind"], message: `this design is a ${design.kind}` }]);
  const tables = await tablesFor(db, project.id, content);
  await db.transaction(async (tx) => {
    const locked = await revisionRow(tx, id, true);
    if (!locked) throw new HttpError("not_found", "No such revision");
    if (locked.state !== "draft") throw frozen(locked.number, locked.state);
    await tx.update(revisions).set({ content }).where(eq(revisions.id, id));
    await tx.delete(coefficientTables).where(eq(coefficientTables.revisionId, id));
    await insertTables(tx, id, tables);
    await recordContentAuthors(tx, id, viewer.id, content);
    await tx.update(designs).set({ updatedAt: new Date() }).where(eq(designs.id, design.id));
    await recordAudit(tx, {
      action: "revision.update",
      projectId: project.id,
      subjectType: "revision",
      subjectId: id,
      summary: `Edited draft r${locked.number} of ${design.name}`,
      details: { designId: design.id, number: locked.number, tables: tables.length },
    });
  });
  return getRevision(db, viewer, id);
}

/**
 * Fix the content hash and move a draft to in_review through the lifecycle table (issue 6): only an author,
 * only from draft, and only with a finished report for exactly the content being fixed; audited and mailed.
 */
export async function submitRevision(db: Db, viewer: Viewer, id: number): Promise<RevisionDetail> {
  await revisionFacts(db, viewer, id); // non-members get 404 before any other answer
  await db.transaction(async (tx) => {
    const facts = await revisionFacts(tx, viewer, id, true);
    const locked = await revisionRow(tx, id);
    if (!locked) throw new HttpError("not_found", "No such revision");
    const tables = await tx
      .select({
        role: coefficientTables.role,
        position: coefficientTables.position,
        sampleRateHz: coefficientTables.sampleRateHz,
        complex: coefficientTables.complex,
        valuesSha256: coefficientTables.valuesSha256,
      })
      .from(coefficientTables)
      .where(eq(coefficientTables.revisionId, id));
    await submitInTx(tx, viewer, facts, contentHash(locked.content, tables));
  });
  return getRevision(db, viewer, id);
}

/** The stored values of one table (interleaved little-endian float64) and their SHA-256. */
export async function tableValues(
  db: Db,
  viewer: Viewer,
  revisionId: number,
  tableId: number,
): Promise<{ values: Buffer; sha256: string; role: string }> {
  await visibleRevision(db, viewer, revisionId);
  const [t] = await db
    .select({
      values: coefficientTables.values,
      sha256: coefficientTables.valuesSha256,
      role: coefficientTables.role,
    })
    .from(coefficientTables)
    .where(and(eq(coefficientTables.id, tableId), eq(coefficientTables.revisionId, revisionId)));
  if (!t) throw new HttpError("not_found", "No such table in this revision");
  return t;
}
