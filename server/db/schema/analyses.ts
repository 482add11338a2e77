import { sql } from "drizzle-orm";
import {
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
} from "drizzle-orm/pg-core";
import { ANALYSIS_STATES } from "../../../shared/schemas/analyses";
import { revisions } from "./designs";

export const analysisStateEnum = pgEnum("analysis_state", ANALYSIS_STATES);

/**
 * One analysis report per content hash: the same content (drafts included) never computes twice.
 * `revision_id` is the revision that first asked; any revision with the same hash reuses the row.
 */
export const analysisReports = pgTable(
  "analysis_reports",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    contentHash: text("content_hash").notNull().unique(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id),
    state: analysisStateEnum("state").notNull().default("queued"),
    progress: doublePrecision("progress").notNull().default(0),
    stage: text("stage"),
    error: text("error"),
    report: jsonb("report"),
    reportVersion: integer("report_version"),
    softwareVersion: text("software_version"),
    attempts: integer("attempts").notNull().default(0),
    queuedAt: timestamp("queued_at", { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp("started_at", { withTimezone: true }),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
    durationMs: integer("duration_ms"),
  },
  (t) => [
    index("analysis_reports_revision_idx").on(t.revisionId),
    check("analysis_reports_progress_range", sql`${t.progress} >= 0 and ${t.progress} <= 1`),
    check("analysis_reports_done_has_report", sql`${t.state} <> 'done' or ${t.report} is not null`),
  ],
);
