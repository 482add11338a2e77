import { sql } from "drizzle-orm";
import { check, index, integer, pgTable, text, timestamp, varchar } from "drizzle-orm/pg-core";
import { TOKEN_SCOPES } from "../../../shared/schemas/tokens";
import { users } from "./users";

/**
 * API tokens for scripts and CI. Only the SHA-256 of the secret is stored (the secret has 256 random
 * bits, so a plain hash is enough: no password stretching needed); `prefix` is shown to recognise it.
 */
export const apiTokens = pgTable(
  "api_tokens",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 80 }).notNull(),
    prefix: varchar("prefix", { length: 8 }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    scope: text("scope", { enum: TOKEN_SCOPES }).notNull().default("read"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
  },
  (t) => [
    check("api_tokens_scope_check", sql`${t.scope} in ('read', 'read-write', 'verify')`),
    check("api_tokens_hash_format", sql`${t.tokenHash} ~ '^[0-9a-f]{64}$'`),
    index("api_tokens_user_idx").on(t.userId),
  ],
);
