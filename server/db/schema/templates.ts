import { sql } from "drizzle-orm";
import { check, index, integer, pgTable, primaryKey, text, timestamp, varchar } from "drizzle-orm/pg-core";
import { users } from "./users";

/** Custom export templates written by admins (built-ins live in templates/export/, not here). */
export const exportTemplates = pgTable(
  "export_templates",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    name: varchar("name", { length: 80 }).notNull().unique(),
    description: text("description").notNull().default(""),
    extension: varchar("extension", { length: 16 }).notNull(),
    body: text("body").notNull(),
    // 1 on creation, +1 on every change; bundles name the version they used.
    version: integer("version").notNull().default(1),
    createdById: integer("created_by")
      .notNull()
      .references(() => users.id),
    updatedById: integer("updated_by")
      .notNull()
      .references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check("export_templates_version_positive", sql`${t.version} >= 1`),
    check("export_templates_extension_format", sql`${t.extension} ~ '^[a-z0-9]{1,16}$'`),
  ],
);

/** Every version of a custom template as it was saved, so a bundle's "template X v3" can be traced. */
export const exportTemplateVersions = pgTable(
  "export_template_versions",
  {
    templateId: integer("template_id")
      .notNull()
      .references(() => exportTemplates.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    name: varchar("name", { length: 80 }).notNull(),
    extension: varchar("extension", { length: 16 }).notNull(),
    body: text("body").notNull(),
    savedById: integer("saved_by")
      .notNull()
      .references(() => users.id),
    savedAt: timestamp("saved_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.templateId, t.version] }),
    index("export_template_versions_saved_idx").on(t.savedAt),
  ],
);
