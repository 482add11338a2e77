import { sql } from "drizzle-orm";
import {
  boolean,
  check,
  index,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  varchar,
} from "drizzle-orm/pg-core";
import { bytea } from "./designs";
import { releases } from "./reviews";
import { users } from "./users";

/**
 * A firmware engineer's simulation output for one vector set of a release, kept byte for byte with its
 * SHA-256, and the bit-exact verdict computed on arrival. Append-only: a trigger
 * (drizzle/0015_verification_runs_append_only.sql) refuses UPDATE, DELETE and TRUNCATE, so evidence is never
 * rewritten; a new run is a new row.
 */
export const verificationRuns = pgTable(
  "verification_runs",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    releaseId: integer("release_id")
      .notNull()
      .references(() => releases.id, { onDelete: "restrict" }),
    vectorSet: varchar("vector_set", { length: 40 }).notNull(),
    verdict: text("verdict", { enum: ["pass", "fail"] }).notNull(),
    compared: integer("compared").notNull(),
    mismatches: integer("mismatches").notNull(),
    latencySamples: integer("latency_samples").notNull(),
    latencySource: text("latency_source", { enum: ["declared", "searched"] }).notNull(),
    /** First mismatch, error envelope, missing/extra counts: everything else the comparison found. */
    result: jsonb("result").$type<Record<string, unknown>>().notNull(),
    outputBits: integer("output_bits").notNull(),
    format: text("format", { enum: ["text", "hex"] }).notNull(),
    fileName: varchar("file_name", { length: 255 }).notNull(),
    upload: bytea("upload").notNull(),
    uploadSha256: text("upload_sha256").notNull(),
    uploadSize: integer("upload_size").notNull(),
    simulator: varchar("simulator", { length: 120 }),
    rtlRevision: varchar("rtl_revision", { length: 120 }),
    releaseWithdrawn: boolean("release_withdrawn").notNull(),
    uploadedById: integer("uploaded_by")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    tokenId: integer("token_id"),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("verification_runs_release_idx").on(t.releaseId, t.id),
    check("verification_runs_verdict_check", sql`${t.verdict} in ('pass', 'fail')`),
    check("verification_runs_sha256_format", sql`${t.uploadSha256} ~ '^[0-9a-f]{64}$'`),
    check("verification_runs_verdict_consistent", sql`(${t.verdict} = 'pass') = (${t.mismatches} = 0)`),
  ],
);
