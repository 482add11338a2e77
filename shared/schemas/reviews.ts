/**
 * Review contracts (issue 6): the reviewer's queue, the review page, comments and decisions.
 * A decision is bound to the revision's content hash and the hash of the report the reviewer read.
 */
import { z } from "zod";
import { RevisionStateSchema } from "./designs";
import { PersonSchema } from "./releases";

export const REVIEW_DECISIONS = ["approved", "changes_requested"] as const;
/** What a reviewer decides. */
export const ReviewDecisionSchema = z.enum(REVIEW_DECISIONS);
export type ReviewDecision = z.infer<typeof ReviewDecisionSchema>;

/** POST /api/revisions/:id/decision ("changes requested" needs a comment; checked here and on the server). */
export const DecisionInputSchema = z
  .object({
    decision: ReviewDecisionSchema,
    comment: z.string().trim().max(20_000, "at most 20000 characters").default(""),
  })
  .refine((v) => v.decision !== "changes_requested" || v.comment.length > 0, {
    path: ["comment"],
    message: "say what needs to change",
  });
export type DecisionInput = z.input<typeof DecisionInputSchema>;

/** POST /api/revisions/:id/comments (plain text; the client renders it as text, never as HTML). */
export const CommentInputSchema = z.object({
  body: z.string().trim().min(1, "write a comment").max(20_000, "at most 20000 characters"),
});
export type CommentInput = z.input<typeof CommentInputSchema>;

/** One comment of a revision's thread. */
export const ReviewCommentSchema = z.object({
  id: z.number().int(),
  author: PersonSchema,
  body: z.string(),
  at: z.string(),
});
export type ReviewComment = z.infer<typeof ReviewCommentSchema>;

/** One decision, with the hashes it is bound to. */
export const ReviewSchema = z.object({
  id: z.number().int(),
  revisionId: z.number().int(),
  decision: ReviewDecisionSchema,
  comment: z.string(),
  reviewer: PersonSchema,
  contentHash: z.string(),
  reportHash: z.string(),
  at: z.string(),
});
export type Review = z.infer<typeof ReviewSchema>;

/** A limit that the report fails (name as in the report, e.g. "pslDb"). */
export const FailingLimitSchema = z.object({
  name: z.string(),
  limit: z.number(),
  value: z.number().nullable(),
});
export type FailingLimit = z.infer<typeof FailingLimitSchema>;

/** The report figures a reviewer compares: float/fixed/diff figures, limits, overall pass. */
export const ReportSummarySchema = z.object({
  contentHash: z.string(),
  reportHash: z.string(),
  pass: z.boolean(),
  fixed: z.record(z.string(), z.number().nullable()),
  float: z.record(z.string(), z.number().nullable()),
  diff: z.record(z.string(), z.number().nullable()),
  limits: z.array(
    z.object({ name: z.string(), limit: z.number(), value: z.number().nullable(), pass: z.boolean() }),
  ),
  finishedAt: z.string().nullable(),
});
export type ReportSummary = z.infer<typeof ReportSummarySchema>;

/** One row of GET /api/reviews/queue (oldest submission first). */
export const QueueItemSchema = z.object({
  revisionId: z.number().int(),
  revisionNumber: z.number().int(),
  designId: z.number().int(),
  designName: z.string(),
  designKind: z.enum(["waveform", "filter"]),
  projectId: z.number().int(),
  projectSlug: z.string(),
  projectName: z.string(),
  submittedBy: PersonSchema,
  submittedAt: z.string(),
  /** False when the caller submitted it (they may not review it). */
  canDecide: z.boolean(),
  pass: z.boolean().nullable(),
  failing: z.array(FailingLimitSchema),
  /** How many acceptance limits the report checked (0 = not judged); absent without a report. */
  limitCount: z.number().int().optional(),
});
export type QueueItem = z.infer<typeof QueueItemSchema>;
export const ReviewQueueSchema = z.object({ items: z.array(QueueItemSchema) });

/** The previous (newest non-withdrawn earlier) release of the same design, with its report figures. */
export const PreviousReleaseFiguresSchema = z.object({
  releaseId: z.number().int(),
  version: z.string(),
  revisionId: z.number().int(),
  revisionNumber: z.number().int(),
  report: ReportSummarySchema.nullable(),
});

/** GET /api/revisions/:id/review */
export const ReviewPageSchema = z.object({
  revision: z.object({
    id: z.number().int(),
    number: z.number().int(),
    state: RevisionStateSchema,
    contentHash: z.string().nullable(),
    submittedBy: PersonSchema.nullable(),
    submittedAt: z.string().nullable(),
  }),
  design: z.object({ id: z.number().int(), name: z.string(), kind: z.enum(["waveform", "filter"]) }),
  project: z.object({ id: z.number().int(), slug: z.string(), name: z.string() }),
  report: ReportSummarySchema.nullable(),
  previousRelease: PreviousReleaseFiguresSchema.nullable(),
  comments: z.array(ReviewCommentSchema),
  decisions: z.array(ReviewSchema),
  /** What the caller may do now, from the lifecycle table (the UI shows only these buttons). */
  allowedActions: z.array(z.string()),
});
export type ReviewPage = z.infer<typeof ReviewPageSchema>;

/** POST /api/revisions/:id/comments → 201 */
export const CommentResponseSchema = z.object({ comment: ReviewCommentSchema });
/** POST /api/revisions/:id/decision → 201; POST /api/revisions/:id/submit → 200 (state only). */
export const TransitionResponseSchema = z.object({
  revision: z.object({ id: z.number().int(), number: z.number().int(), state: RevisionStateSchema }),
  review: ReviewSchema.optional(),
});

/** A revision named on the home page. */
export const HomeRevisionSchema = z.object({
  revisionId: z.number().int(),
  revisionNumber: z.number().int(),
  designId: z.number().int(),
  designName: z.string(),
  state: RevisionStateSchema,
});

/** A release named on the home page. */
export const HomeReleaseSchema = z.object({
  id: z.number().int(),
  designName: z.string(),
  projectSlug: z.string(),
  version: z.string(),
  releasedAt: z.string(),
  withdrawn: z.boolean(),
  /** Firmware's unverified list: the newest run's verdict and how many vector sets have passed, of how many. */
  verification: z
    .object({
      latest: z.enum(["pass", "fail"]).nullable(),
      passedSets: z.number().int(),
      sets: z.number().int(),
    })
    .optional(),
});

/** The review/release part of GET /api/home (`work`), per role; absent parts are for roles the user lacks. */
export const HomeWorkSchema = z.object({
  /** Author: my drafts, my revisions with changes requested, the last releases in my projects. */
  myDrafts: z.array(HomeRevisionSchema).optional(),
  changesRequested: z.array(HomeRevisionSchema).optional(),
  lastReleases: z.array(HomeReleaseSchema).optional(),
  /** Reviewer: how many revisions wait in my queue. */
  queueCount: z.number().int().optional(),
  /** Firmware: the newest releases (not withdrawn) in my projects. */
  newestReleases: z.array(HomeReleaseSchema).optional(),
  /** Firmware: active releases in my projects where some vector set has no passing verification run yet. */
  unverifiedReleases: z.array(HomeReleaseSchema).optional(),
});
export type HomeWork = z.infer<typeof HomeWorkSchema>;
