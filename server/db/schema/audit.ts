import { sql } from "drizzle-orm";
import { bigint, check, index, integer, jsonb, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { AUDIT_ACTOR_KINDS } from "../../../shared/schemas/audit";

/**
 * The append-only audit trail. A trigger (drizzle/0004_audit_append_only.sql) refuses UPDATE, DELETE and
 * TRUNCATE. User and project ids carry no foreign keys on purpose: the log must outlive and never block
 * changes to the rows it talks about.
 */
export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigint("id", { mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    actorUserId: integer("actor_user_id"),
    actorKind: text("actor_kind", { enum: AUDIT_ACTOR_KINDS }).notNull(),
    action: text("action").notNull(),
    projectId: integer("project_id"),
    subjectType: text("subject_type"),
    subjectId: text("subject_id"),
    summary: text("summary").notNull(),
    details: jsonb("details").$type<Record<string, unknown>>().notNull().default({}),
    ip: text("ip"),
  },
  (t) => [
    check("audit_events_actor_kind_check", sql`${t.actorKind} in ('user', 'token', 'system')`),
    check("audit_events_action_check", sql`${t.action} ~ '^[a-z][a-z0-9-]*(\\.[a-z][a-z0-9-]*)+$'`),
    index("audit_events_at_idx").on(t.at),
    index("audit_events_project_idx").on(t.projectId, t.id),
    index("audit_events_actor_idx").on(t.actorUserId, t.id),
    index("audit_events_action_idx").on(t.action, t.id),
  ],
);
