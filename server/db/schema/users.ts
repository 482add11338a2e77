import { sql } from "drizzle-orm";
import {
  boolean,
  index,
  integer,
  json,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  varchar,
} from "drizzle-orm/pg-core";
import { ROLES } from "../../../shared/schemas/auth";

/** Roles as a PostgreSQL enum, so a stray string cannot be stored. */
export const roleEnum = pgEnum("role", ROLES);

/** People who sign in. Deactivated rows stay for the audit trail; they are never deleted. */
export const users = pgTable("users", {
  id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
  username: varchar("username", { length: 40 }).notNull().unique(),
  displayName: varchar("display_name", { length: 120 }).notNull(),
  email: varchar("email", { length: 320 }).notNull(),
  passwordHash: text("password_hash").notNull(),
  active: boolean("active").notNull().default(true),
  mustChangePassword: boolean("must_change_password").notNull().default(false),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  lastSignInAt: timestamp("last_sign_in_at", { withTimezone: true }),
});

/** One row per role a user holds. */
export const userRoles = pgTable(
  "user_roles",
  {
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);

/** connect-pg-simple's table, owned by our migrations (STACK.md: no createTableIfMissing). */
export const session = pgTable(
  "session",
  {
    sid: varchar("sid").primaryKey(),
    sess: json("sess").notNull(),
    expire: timestamp("expire", { precision: 6 }).notNull(),
    // Copied from sess.passport.user on write, so "end this user's sessions" is one indexed delete.
    userId: integer("user_id").generatedAlwaysAs(sql`((sess -> 'passport' ->> 'user')::integer)`),
  },
  (t) => [index("IDX_session_expire").on(t.expire), index("session_user_id_idx").on(t.userId)],
);

/**
 * Consecutive failed sign-ins per user name (known or not, so a lock says nothing about whether an account
 * exists); a successful sign-in deletes the row. server/auth/backoff.ts reads it.
 */
export const signInFailures = pgTable("sign_in_failures", {
  username: varchar("username", { length: 200 }).primaryKey(),
  failures: integer("failures").notNull().default(0),
  lastAt: timestamp("last_at", { withTimezone: true }).notNull().defaultNow(),
  lockedUntil: timestamp("locked_until", { withTimezone: true }),
});
