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
  unique,
} from "drizzle-orm/pg-core";
import { ANALYSIS_STATES } from "../../../shared/schemas/analyses";
import { revisions } from "./designs";
import { projects } from "./projects";

export const analysisStateEnum = pgEnum("analysis_state", ANALYSIS_STATES);

/**
 * One analysis report per project and content hash: the same content (drafts included) never computes twice
 * within a project, and no project learns from a report (its state or times) that another project holds the
 * same content. `revision_id` is the revision that first asked; any revision of the project with the same hash
 * reuses the row.
 */
export const analysisReports = pgTable(
  "analysis_reports",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    projectId: integer("project_id")
      .notNull()
      .references(() => projects.id),
    contentHash: text("content_hash").notNull(),
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
    unique("analysis_reports_project_hash_unique").on(t.projectId, t.contentHash),
    index("analysis_reports_hash_idx").on(t.contentHash),
    index("analysis_reports_revision_idx").on(t.revisionId),
    check("analysis_reports_progress_range", sql`${t.progress} >= 0 and ${t.progress} <= 1`),
    check("analysis_reports_done_has_report", sql`${t.state} <> 'done' or ${t.report} is not null`),
  ],
);
