import { sql } from "drizzle-orm";
import {
  check,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  unique,
  varchar,
} from "drizzle-orm/pg-core";
import { REVIEW_DECISIONS } from "../../../shared/schemas/reviews";
import { bytea, designs, revisions } from "./designs";
import { users } from "./users";

export const reviewDecisionEnum = pgEnum("review_decision", REVIEW_DECISIONS);

/**
 * A reviewer's decision, bound to the content hash it judged and the hash of the report it read.
 * Append-only (trigger): a later decision on a new revision never rewrites an old one.
 */
export const reviews = pgTable(
  "reviews",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id),
    contentHash: text("content_hash").notNull(),
    reportHash: text("report_hash").notNull(),
    decision: reviewDecisionEnum("decision").notNull(),
    comment: text("comment").notNull().default(""),
    reviewerId: integer("reviewer_id")
      .notNull()
      .references(() => users.id),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("reviews_revision_idx").on(t.revisionId),
    check(
      "reviews_changes_need_comment",
      sql`${t.decision} <> 'changes_requested' or length(btrim(${t.comment})) > 0`,
    ),
  ],
);

/** A revision's plain-text comment thread; append-only (trigger). */
export const reviewComments = pgTable(
  "review_comments",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id),
    authorId: integer("author_id")
      .notNull()
      .references(() => users.id),
    body: text("body").notNull(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_comments_revision_idx").on(t.revisionId)],
);

/**
 * A semantic version of an approved revision with its bundle, built once. A trigger refuses DELETE and
 * any UPDATE other than setting the three withdrawal fields once, so a version is never reused.
 */
export const releases = pgTable(
  "releases",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    designId: integer("design_id")
      .notNull()
      .references(() => designs.id),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id),
    version: varchar("version", { length: 40 }).notNull(),
    major: integer("major").notNull(),
    minor: integer("minor").notNull(),
    patch: integer("patch").notNull(),
    notes: text("notes").notNull(),
    releasedById: integer("released_by")
      .notNull()
      .references(() => users.id),
    releasedAt: timestamp("released_at", { withTimezone: true }).notNull(),
    contentHash: text("content_hash").notNull(),
    bundle: bytea("bundle"),
    bundleSha256: text("bundle_sha256"),
    bundleSize: integer("bundle_size"),
    manifest: jsonb("manifest"),
    withdrawnAt: timestamp("withdrawn_at", { withTimezone: true }),
    withdrawnById: integer("withdrawn_by").references(() => users.id),
    withdrawReason: text("withdraw_reason"),
  },
  (t) => [
    unique("releases_design_version_unique").on(t.designId, t.version),
    unique("releases_design_semver_unique").on(t.designId, t.major, t.minor, t.patch),
    index("releases_revision_idx").on(t.revisionId),
    check(
      "releases_version_parts",
      sql`${t.version} = ${t.major}::text || '.' || ${t.minor}::text || '.' || ${t.patch}::text`,
    ),
    check(
      "releases_withdrawal_complete",
      sql`(${t.withdrawnAt} is null) = (${t.withdrawnById} is null) and (${t.withdrawnAt} is null) = (${t.withdrawReason} is null)`,
    ),
  ],
);
