/**
 * Reviews (issue 6): the reviewer's queue, the review page, the comment thread and decisions. A decision
 * is bound to the revision's content hash and to the SHA-256 of the report the reviewer read, and every
 * transition goes through the lifecycle table with its audit row and its mail in one transaction.
 */
import { createHash } from "node:crypto";
import { and, asc, desc, eq, inArray, isNull, lt, sql } from "drizzle-orm";
import type { RevisionState } from "../../shared/schemas/designs";
import type {
  DecisionInput,
  FailingLimit,
  QueueItem,
  Review,
  ReviewComment,
  ReviewPage,
  ReportSummary,
} from "../../shared/schemas/reviews";
import type { z } from "zod";
import type { DecisionInputSchema } from "../../shared/schemas/reviews";
import type { Db } from "../db/client";
import {
  analysisReports,
  designs,
  projectMembers,
  projects,
  releases,
  reviewComments,
  reviews,
  revisions,
  users,
} from "../db/schema";
import { env } from "../env";
import { HttpError } from "../http/errors";
import { notify } from "../mail/notifications";
import { recordAudit } from "./audit";
import { contentAuthorIds, contentAuthorsOf } from "./authorship";
import { canonicalJson } from "./content-hash";
import { projectAccess, type ProjectRef, type Tx } from "./designs";
import { allowedActions, authorize, type LifecycleSubject } from "./lifecycle";
import type { Viewer } from "./projects";

/** A revision with what the lifecycle and the mail need, as seen by a member. */
export interface RevisionFacts extends LifecycleSubject {
  id: number;
  designId: number;
  contentHash: string | null;
  createdById: number;
  submittedAt: Date | null;
  design: { id: number; name: string; kind: "waveform" | "filter" };
  project: ProjectRef;
}

/** The revision (locked FOR UPDATE inside a transaction when asked) if the viewer is a member; 404 otherwise. */
export async function revisionFacts(
  db: Db | Tx,
  viewer: Viewer,
  id: number,
  lock = false,
): Promise<RevisionFacts> {
  const q = db
    .select({
      id: revisions.id,
      designId: revisions.designId,
      number: revisions.number,
      state: revisions.state,
      contentHash: revisions.contentHash,
      createdById: revisions.createdById,
      submittedById: revisions.submittedById,
      submittedAt: revisions.submittedAt,
      designName: designs.name,
      designKind: designs.kind,
      projectId: designs.projectId,
    })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .where(eq(revisions.id, id));
  const [row] = lock ? await q.for("update", { of: revisions }) : await q;
  if (!row) throw new HttpError("not_found", "No such revision");
  const project = await projectAccess(db, viewer, row.projectId, "No such revision");
  const authorIds = await contentAuthorIds(db, row.id);
  return {
    id: row.id,
    designId: row.designId,
    number: row.number,
    state: row.state,
    contentHash: row.contentHash,
    createdById: row.createdById,
    submittedById: row.submittedById,
    submittedAt: row.submittedAt,
    authorIds,
    design: { id: row.designId, name: row.designName, kind: row.designKind },
    project,
  };
}

/** SHA-256 (hex) of the report's canonical JSON: names exactly the figures a reviewer read. */
export function reportHash(report: unknown): string {
  return createHash("sha256").update(canonicalJson(report), "utf8").digest("hex");
}

interface StoredReport {
  pass?: boolean;
  float?: Record<string, number | null>;
  fixed?: Record<string, number | null>;
  diff?: Record<string, number | null>;
  limits?: { name: string; limit: number; value: number | null; pass: boolean }[];
}

/** The project's finished report of a content hash as a summary, or null while there is none. */
export async function reportSummary(
  db: Db | Tx,
  projectId: number,
  contentHash: string,
): Promise<ReportSummary | null> {
  const [row] = await db
    .select({
      report: analysisReports.report,
      state: analysisReports.state,
      finishedAt: analysisReports.finishedAt,
    })
    .from(analysisReports)
    .where(and(eq(analysisReports.projectId, projectId), eq(analysisReports.contentHash, contentHash)));
  if (!row || row.state !== "done" || row.report === null) return null;
  const r = row.report as StoredReport;
  return {
    contentHash,
    reportHash: reportHash(row.report),
    pass: r.pass ?? false,
    float: r.float ?? {},
    fixed: r.fixed ?? {},
    diff: r.diff ?? {},
    limits: r.limits ?? [],
    finishedAt: row.finishedAt?.toISOString() ?? null,
  };
}

const failingOf = (s: ReportSummary | null): FailingLimit[] =>
  (s?.limits ?? []).filter((l) => !l.pass).map(({ name, limit, value }) => ({ name, limit, value }));

/** The mail context shared by every event of a revision. */
export function mailBase(r: RevisionFacts, actorUserId: number) {
  return {
    projectId: r.project.id,
    design: r.design,
    revision: { id: r.id, number: r.number },
    actorUserId,
    authorUserId: r.submittedById ?? r.createdById,
    baseUrl: env().PUBLIC_URL,
  };
}

/**
 * Move a draft to in_review: the lifecycle allows it, and a finished report exists for the hash being fixed.
 * Runs in the caller's transaction with the revision already locked; writes the audit row and the mail.
 */
export async function submitInTx(tx: Tx, viewer: Viewer, r: RevisionFacts, hash: string): Promise<void> {
  const next = authorize("submit", r, viewer);
  const report = await reportSummary(tx, r.project.id, hash);
  if (!report)
    throw new HttpError(
      "conflict",
      `r${r.number} has no finished analysis for its current content: run the analysis and wait for the report, then submit`,
      { reason: "no_report", contentHash: hash },
    );
  await tx
    .update(revisions)
    .set({ state: next, contentHash: hash, submittedById: viewer.id, submittedAt: new Date() })
    .where(eq(revisions.id, r.id));
  await recordAudit(tx, {
    action: "revision.submit",
    projectId: r.project.id,
    subjectType: "revision",
    subjectId: r.id,
    summary: `Submitted r${r.number} of ${r.design.name} for review`,
    details: {
      designId: r.design.id,
      number: r.number,
      contentHash: hash,
      reportHash: report.reportHash,
      pass: report.pass,
    },
  });
  await notify(tx, "submitted", { ...mailBase({ ...r, submittedById: viewer.id }, viewer.id) });
}

const person = (id: number, displayName: string) => ({ id, displayName });

/** POST /api/revisions/:id/decision */
export async function decide(
  db: Db,
  viewer: Viewer,
  revisionId: number,
  input: z.infer<typeof DecisionInputSchema>,
): Promise<{ revision: { id: number; number: number; state: RevisionState }; review: Review }> {
  await revisionFacts(db, viewer, revisionId); // 404 before anything else
  const id = await db.transaction(async (tx) => {
    const r = await revisionFacts(tx, viewer, revisionId, true);
    const action = input.decision === "approved" ? "approve" : "request_changes";
    const next = authorize(action, r, viewer);
    if (!r.contentHash) throw new Error(`revision ${r.id} is ${r.state} without a content hash`);
    const report = await reportSummary(tx, r.project.id, r.contentHash);
    if (!report)
      throw new HttpError(
        "conflict",
        "The report this decision would be bound to is missing: run the analysis again",
        {
          reason: "no_report",
        },
      );
    const [row] = await tx
      .insert(reviews)
      .values({
        revisionId: r.id,
        contentHash: r.contentHash,
        reportHash: report.reportHash,
        decision: input.decision,
        comment: input.comment,
        reviewerId: viewer.id,
      })
      .returning({ id: reviews.id });
    if (!row) throw new Error("review insert returned no row");
    await tx.update(revisions).set({ state: next }).where(eq(revisions.id, r.id));
    const approved = input.decision === "approved";
    await recordAudit(tx, {
      action: approved ? "review.approve" : "review.request-changes",
      projectId: r.project.id,
      subjectType: "revision",
      subjectId: r.id,
      summary: `${approved ? "Approved" : "Requested changes to"} r${r.number} of ${r.design.name}`,
      details: {
        reviewId: row.id,
        contentHash: r.contentHash,
        reportHash: report.reportHash,
        comment: input.comment,
      },
    });
    if (approved) await notify(tx, "approved", { ...mailBase(r, viewer.id), comment: input.comment });
    else await notify(tx, "changes-requested", { ...mailBase(r, viewer.id), comment: input.comment });
    return { reviewId: row.id, number: r.number, state: next };
  });
  const [review] = await reviewRows(db, eq(reviews.id, id.reviewId));
  if (!review) throw new Error(`review ${id.reviewId} vanished`);
  return { revision: { id: revisionId, number: id.number, state: id.state }, review };
}

/** POST /api/revisions/:id/comments */
export async function addComment(
  db: Db,
  viewer: Viewer,
  revisionId: number,
  body: string,
): Promise<ReviewComment> {
  await revisionFacts(db, viewer, revisionId);
  const commentId = await db.transaction(async (tx) => {
    const r = await revisionFacts(tx, viewer, revisionId, true);
    authorize("comment", r, viewer);
    const [row] = await tx
      .insert(reviewComments)
      .values({ revisionId, authorId: viewer.id, body })
      .returning({ id: reviewComments.id });
    if (!row) throw new Error("comment insert returned no row");
    await recordAudit(tx, {
      action: "review.comment",
      projectId: r.project.id,
      subjectType: "revision",
      subjectId: r.id,
      summary: `Commented on r${r.number} of ${r.design.name}`,
      details: { commentId: row.id, length: body.length },
    });
    return row.id;
  });
  const [comment] = await commentRows(db, eq(reviewComments.id, commentId));
  if (!comment) throw new Error(`comment ${commentId} vanished`);
  return comment;
}

async function commentRows(db: Db | Tx, where: ReturnType<typeof eq>): Promise<ReviewComment[]> {
  const rows = await db
    .select({
      id: reviewComments.id,
      body: reviewComments.body,
      at: reviewComments.at,
      authorId: users.id,
      authorName: users.displayName,
    })
    .from(reviewComments)
    .innerJoin(users, eq(users.id, reviewComments.authorId))
    .where(where)
    .orderBy(asc(reviewComments.at), asc(reviewComments.id));
  return rows.map((c) => ({
    id: c.id,
    body: c.body,
    at: c.at.toISOString(),
    author: person(c.authorId, c.authorName),
  }));
}

/** Decisions matching a condition, oldest first. */
export async function reviewRows(db: Db | Tx, where: ReturnType<typeof eq>): Promise<Review[]> {
  const rows = await db
    .select({
      id: reviews.id,
      revisionId: reviews.revisionId,
      decision: reviews.decision,
      comment: reviews.comment,
      contentHash: reviews.contentHash,
      reportHash: reviews.reportHash,
      at: reviews.at,
      reviewerId: users.id,
      reviewerName: users.displayName,
    })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(where)
    .orderBy(asc(reviews.at), asc(reviews.id));
  return rows.map(({ reviewerId, reviewerName, at, ...r }) => ({
    ...r,
    at: at.toISOString(),
    reviewer: person(reviewerId, reviewerName),
  }));
}

/** GET /api/revisions/:id/review */
export async function reviewPage(db: Db, viewer: Viewer, revisionId: number): Promise<ReviewPage> {
  const r = await revisionFacts(db, viewer, revisionId);
  const [submitter] = r.submittedById
    ? await db
        .select({ id: users.id, displayName: users.displayName })
        .from(users)
        .where(eq(users.id, r.submittedById))
    : [];
  // The previous release: the newest release of an earlier revision of the same design, withdrawn or not.
  const [prev] = await db
    .select({
      id: releases.id,
      version: releases.version,
      revisionId: releases.revisionId,
      number: revisions.number,
      hash: releases.contentHash,
    })
    .from(releases)
    .innerJoin(revisions, eq(revisions.id, releases.revisionId))
    .where(
      and(eq(releases.designId, r.designId), lt(revisions.number, r.number), isNull(releases.withdrawnAt)),
    )
    .orderBy(desc(releases.releasedAt), desc(releases.id))
    .limit(1);
  return {
    revision: {
      id: r.id,
      number: r.number,
      state: r.state,
      contentHash: r.contentHash,
      submittedBy: submitter ?? null,
      submittedAt: r.submittedAt?.toISOString() ?? null,
    },
    design: r.design,
    project: r.project,
    report: r.contentHash ? await reportSummary(db, r.project.id, r.contentHash) : null,
    previousRelease: prev
      ? {
          releaseId: prev.id,
          version: prev.version,
          revisionId: prev.revisionId,
          revisionNumber: prev.number,
          report: await reportSummary(db, r.project.id, prev.hash),
        }
      : null,
    comments: await commentRows(db, eq(reviewComments.revisionId, r.id)),
    decisions: await reviewRows(db, eq(reviews.revisionId, r.id)),
    allowedActions: allowedActions(r, viewer),
  };
}

/** GET /api/reviews/queue: revisions in review in the reviewer's projects, oldest submission first. */
export async function reviewQueue(db: Db, viewer: Viewer): Promise<QueueItem[]> {
  if (!viewer.roles.includes("reviewer"))
    throw new HttpError("forbidden", "The review queue is for reviewers");
  const rows = await db
    .select({
      revisionId: revisions.id,
      revisionNumber: revisions.number,
      contentHash: revisions.contentHash,
      designId: designs.id,
      designName: designs.name,
      designKind: designs.kind,
      projectId: projects.id,
      projectSlug: projects.slug,
      projectName: projects.name,
      submittedById: revisions.submittedById,
      submittedByName: users.displayName,
      submittedAt: revisions.submittedAt,
    })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .innerJoin(projects, eq(projects.id, designs.projectId))
    .innerJoin(users, eq(users.id, revisions.submittedById))
    .where(
      and(
        eq(revisions.state, "in_review"),
        inArray(
          designs.projectId,
          db
            .select({ id: projectMembers.projectId })
            .from(projectMembers)
            .where(eq(projectMembers.userId, viewer.id)),
        ),
      ),
    )
    .orderBy(asc(revisions.submittedAt), asc(revisions.id));
  const hashes = rows.map((r) => r.contentHash).filter((h): h is string => h !== null);
  // Keyed by project and hash: a project sees only its own reports.
  const summaries = new Map<string, ReportSummary>();
  const keyOf = (projectId: number, hash: string) => `${projectId}:${hash}`;
  if (hashes.length > 0) {
    const done = await db
      .select({ projectId: analysisReports.projectId, hash: analysisReports.contentHash })
      .from(analysisReports)
      .where(and(inArray(analysisReports.contentHash, hashes), sql`${analysisReports.state} = 'done'`));
    for (const d of done) {
      const s = await reportSummary(db, d.projectId, d.hash);
      if (s) summaries.set(keyOf(d.projectId, d.hash), s);
    }
  }
  const authors = await contentAuthorsOf(
    db,
    rows.map((r) => r.revisionId),
  );
  return rows.map((r) => {
    const s = r.contentHash ? (summaries.get(keyOf(r.projectId, r.contentHash)) ?? null) : null;
    return {
      revisionId: r.revisionId,
      revisionNumber: r.revisionNumber,
      designId: r.designId,
      designName: r.designName,
      designKind: r.designKind,
      projectId: r.projectId,
      projectSlug: r.projectSlug,
      projectName: r.projectName,
      submittedBy: person(r.submittedById ?? 0, r.submittedByName),
      submittedAt: (r.submittedAt ?? new Date(0)).toISOString(),
      canDecide: r.submittedById !== viewer.id && !authors.get(r.revisionId)?.has(viewer.id),
      pass: s?.pass ?? null,
      failing: failingOf(s),
      ...(s ? { limitCount: s.limits.length } : {}),
    };
  });
}

/** Input type re-exported for the routes. */
export type { DecisionInput };

/** Revisions for the author's home page: mine in a given state, newest first. */
export async function myRevisionsIn(db: Db, viewer: Viewer, state: RevisionState, limit = 10) {
  const rows = await db
    .select({
      revisionId: revisions.id,
      revisionNumber: revisions.number,
      designId: designs.id,
      designName: designs.name,
      state: revisions.state,
    })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .where(
      and(
        eq(revisions.state, state),
        state === "draft" ? eq(revisions.createdById, viewer.id) : eq(revisions.submittedById, viewer.id),
        inArray(
          designs.projectId,
          db
            .select({ id: projectMembers.projectId })
            .from(projectMembers)
            .where(eq(projectMembers.userId, viewer.id)),
        ),
        // A revision a newer one has replaced no longer waits for anything.
        sql`not exists (select 1 from ${revisions} as newer where newer.design_id = ${revisions.designId} and newer.number > ${revisions.number})`,
      ),
    )
    .orderBy(desc(revisions.createdAt))
    .limit(limit);
  return rows;
}
