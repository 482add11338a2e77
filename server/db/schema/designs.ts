import { sql } from "drizzle-orm";
import {
  boolean,
  check,
  customType,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uniqueIndex,
  varchar,
  type AnyPgColumn,
} from "drizzle-orm/pg-core";
import { DESIGN_KINDS, REVISION_STATES, TABLE_ROLES } from "../../../shared/schemas/designs";
import { projects } from "./projects";
import { users } from "./users";

/** PostgreSQL bytea as a Node Buffer (drizzle has no built-in bytea column). */
export const bytea = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => "bytea",
});

export const designKindEnum = pgEnum("design_kind", DESIGN_KINDS);
export const revisionStateEnum = pgEnum("revision_state", REVISION_STATES);
export const tableRoleEnum = pgEnum("table_role", TABLE_ROLES);

/** One named coefficient deliverable inside a project. */
export const designs = pgTable(
  "designs",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    projectId: integer("project_id")
      .notNull()
      .references(() => projects.id),
    name: varchar("name", { length: 120 }).notNull(),
    kind: designKindEnum("kind").notNull(),
    description: text("description").notNull().default(""),
    ownerId: integer("owner_id")
      .notNull()
      .references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // Names are stored normalised (shared/schemas/names.ts); case never makes two designs.
  (t) => [uniqueIndex("designs_project_name_ci_unique").on(t.projectId, sql`lower(${t.name})`)],
);

/** r1, r2, … of a design; content is frozen (by a trigger) once the revision leaves `draft`. */
export const revisions = pgTable(
  "revisions",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    designId: integer("design_id")
      .notNull()
      .references(() => designs.id),
    number: integer("number").notNull(),
    state: revisionStateEnum("state").notNull().default("draft"),
    content: jsonb("content").notNull(),
    contentHash: text("content_hash"),
    createdById: integer("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    submittedById: integer("submitted_by").references(() => users.id),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    parentRevisionId: integer("parent_revision_id").references((): AnyPgColumn => revisions.id),
  },
  (t) => [
    unique("revisions_design_number_unique").on(t.designId, t.number),
    // At most one draft per design, so two concurrent "new revision" requests cannot both succeed.
    uniqueIndex("revisions_one_draft_per_design")
      .on(t.designId)
      .where(sql`${t.state} = 'draft'`),
    check("revisions_hash_after_draft", sql`${t.state} = 'draft' or ${t.contentHash} is not null`),
  ],
);

/**
 * Everyone who wrote any of a revision's content: its creator, every editor of the draft, the uploaders of the
 * files it uses, and (for a revision started from another) the authors of the content it carried over. None of
 * them may approve it (server/services/lifecycle.ts).
 */
export const revisionAuthors = pgTable(
  "revision_authors",
  {
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id),
    firstAt: timestamp("first_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.revisionId, t.userId] })],
);

/** The materialized tables of a revision; values = interleaved little-endian float64 [re0, im0, re1, im1, …]. */
export const coefficientTables = pgTable(
  "coefficient_tables",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    role: tableRoleEnum("role").notNull(),
    position: integer("position").notNull(),
    complex: boolean("complex").notNull(),
    length: integer("length").notNull(),
    sampleRateHz: doublePrecision("sample_rate_hz").notNull(),
    source: jsonb("source").notNull(),
    values: bytea("values").notNull(),
    valuesSha256: text("values_sha256").notNull(),
  },
  (t) => [unique("coefficient_tables_revision_role_unique").on(t.revisionId, t.role)],
);

/** Uploaded coefficient files, kept byte for byte; rows are never changed or deleted (trigger). */
export const uploads = pgTable(
  "uploads",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    projectId: integer("project_id")
      .notNull()
      .references(() => projects.id),
    uploadedById: integer("uploaded_by")
      .notNull()
      .references(() => users.id),
    fileName: varchar("file_name", { length: 255 }).notNull(),
    mediaType: varchar("media_type", { length: 255 }).notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256").notNull(),
    content: bytea("content").notNull(),
    format: varchar("format", { length: 20 }).notNull(),
    complex: boolean("complex").notNull(),
    count: integer("count").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("uploads_project_idx").on(t.projectId)],
);
