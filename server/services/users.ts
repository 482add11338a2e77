import { and, asc, eq, inArray, isNull, ne, sql } from "drizzle-orm";
import { passwordProblem, type Role, type SessionUser } from "../../shared/schemas/auth";
import type { CreateUserInput, UpdateUserInput, User } from "../../shared/schemas/users";
import { generateTemporaryPassword, hashPassword, verifyPassword } from "../auth/passwords";
import type { Db } from "../db/client";
import { apiTokens, session, userRoles, users } from "../db/schema";
import { HttpError, validationFailed } from "../http/errors";
import { recordAudit, type Executor } from "./audit";

type UserRow = typeof users.$inferSelect;

/** A user row with its roles, as services pass it around (includes the password hash). */
export interface UserRecord extends UserRow {
  roles: Role[];
}

const ROLE_ORDER: Record<Role, number> = { admin: 0, author: 1, reviewer: 2, firmware: 3 };

/** Roles of several users at once, in a stable order (admin, author, reviewer, firmware). */
export async function rolesByUser(db: Db, userIds: number[]): Promise<Map<number, Role[]>> {
  const out = new Map<number, Role[]>(userIds.map((id) => [id, []]));
  if (userIds.length === 0) return out;
  const rows = await db.select().from(userRoles).where(inArray(userRoles.userId, userIds));
  for (const r of rows) out.get(r.userId)?.push(r.role);
  for (const roles of out.values()) roles.sort((a, b) => ROLE_ORDER[a] - ROLE_ORDER[b]);
  return out;
}

async function withRoles(db: Db, rows: UserRow[]): Promise<UserRecord[]> {
  const roles = await rolesByUser(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((row) => ({ ...row, roles: roles.get(row.id) ?? [] }));
}

/** Find a user by id, or undefined. */
export async function findUserById(db: Db, id: number): Promise<UserRecord | undefined> {
  const rows = await db.select().from(users).where(eq(users.id, id));
  return (await withRoles(db, rows))[0];
}

/** Find a user by user name (case-insensitive), or undefined. */
export async function findUserByUsername(db: Db, username: string): Promise<UserRecord | undefined> {
  const rows = await db.select().from(users).where(eq(users.username, username.trim().toLowerCase()));
  return (await withRoles(db, rows))[0];
}

/** The public view of a user for the session. */
export function toSessionUser(u: UserRecord): SessionUser {
  return {
    id: u.id,
    username: u.username,
    displayName: u.displayName,
    email: u.email,
    roles: u.roles,
    mustChangePassword: u.mustChangePassword,
  };
}

/** The admin view of a user. */
export function toUser(u: UserRecord): User {
  return {
    ...toSessionUser(u),
    active: u.active,
    createdAt: u.createdAt.toISOString(),
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
  };
}

/** The outcome of checking credentials; the route decides the HTTP answer. */
export type CredentialCheck =
  | { ok: true; user: UserRecord }
  | { ok: false; reason: "bad_credentials" }
  | { ok: false; reason: "deactivated" };

/** Check a user name and password, spending bcrypt time even for unknown users. */
export async function checkCredentials(db: Db, username: string, password: string): Promise<CredentialCheck> {
  const user = await findUserByUsername(db, username);
  const ok = await verifyPassword(password, user?.passwordHash);
  if (!user || !ok) return { ok: false, reason: "bad_credentials" };
  if (!user.active) return { ok: false, reason: "deactivated" };
  return { ok: true, user };
}

/** Record a successful sign-in time. */
export async function touchSignIn(db: Executor, userId: number): Promise<void> {
  await db.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, userId));
}

/** What else a password change ends. */
export interface PasswordChangeOptions {
  /** The session that made the change stays signed in; every other session of the user ends. */
  keepSessionId?: string;
  /** Also revoke every live API token of the user. */
  revokeTokens?: boolean;
}

/**
 * Change one's own password after checking the current one; ends the user's other sessions (and, when asked,
 * revokes their API tokens) in the same transaction, so a stolen session or token does not outlive it.
 */
export async function changePassword(
  db: Db,
  userId: number,
  current: string,
  next: string,
  options: PasswordChangeOptions = {},
): Promise<{ endedSessions: number; revokedTokens: number }> {
  const user = await findUserById(db, userId);
  if (!user) throw new HttpError("unauthenticated", "Please sign in");
  if (!(await verifyPassword(current, user.passwordHash))) {
    throw validationFailed([{ path: ["currentPassword"], message: "the current password is not correct" }]);
  }
  const problem = passwordProblem(next, user.username);
  if (problem) throw validationFailed([{ path: ["newPassword"], message: problem }]);
  const passwordHash = await hashPassword(next);
  return db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, mustChangePassword: false }).where(eq(users.id, userId));
    const ended = await tx
      .delete(session)
      .where(
        options.keepSessionId === undefined
          ? eq(session.userId, userId)
          : and(eq(session.userId, userId), ne(session.sid, options.keepSessionId)),
      )
      .returning({ sid: session.sid });
    const revoked = options.revokeTokens
      ? await tx
          .update(apiTokens)
          .set({ revokedAt: new Date() })
          .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
          .returning({ id: apiTokens.id })
      : [];
    await recordAudit(tx, {
      action: "user.password-change",
      subjectType: "user",
      subjectId: userId,
      summary: `${user.username} changed their password (${ended.length} other session(s) ended${
        options.revokeTokens ? `, ${revoked.length} API token(s) revoked` : ""
      })`,
      details: { endedSessions: ended.length, revokedTokens: revoked.length },
    });
    return { endedSessions: ended.length, revokedTokens: revoked.length };
  });
}

/** Every user, for the admin list, sorted by user name. */
export async function listUsers(db: Db): Promise<User[]> {
  const rows = await db.select().from(users).orderBy(asc(users.username));
  return (await withRoles(db, rows)).map(toUser);
}

/** Create a user with a temporary password (generated unless given); returned once, never stored in clear. */
export async function createUser(
  db: Db,
  input: CreateUserInput,
): Promise<{ user: User; temporaryPassword: string }> {
  if (input.temporaryPassword !== undefined) {
    const problem = passwordProblem(input.temporaryPassword, input.username);
    if (problem) throw validationFailed([{ path: ["temporaryPassword"], message: problem }]);
  }
  const temporaryPassword = input.temporaryPassword ?? generateTemporaryPassword();
  const passwordHash = await hashPassword(temporaryPassword);
  const id = await db.transaction(async (tx) => {
    const inserted = await tx
      .insert(users)
      .values({
        username: input.username.toLowerCase(),
        displayName: input.displayName,
        email: input.email,
        passwordHash,
        mustChangePassword: true,
      })
      .onConflictDoNothing({ target: users.username })
      .returning({ id: users.id });
    const row = inserted[0];
    if (!row) throw validationFailed([{ path: ["username"], message: "this user name is taken" }]);
    await tx.insert(userRoles).values([...new Set(input.roles)].map((role) => ({ userId: row.id, role })));
    await recordAudit(tx, {
      action: "user.create",
      subjectType: "user",
      subjectId: row.id,
      summary: `Created user ${input.username.toLowerCase()} with roles ${[...new Set(input.roles)].join(", ")}`,
      details: { username: input.username.toLowerCase(), roles: [...new Set(input.roles)] },
    });
    return row.id;
  });
  const created = await findUserById(db, id);
  if (!created) throw new Error(`user ${id} vanished after insert`);
  return { user: toUser(created), temporaryPassword };
}

/** Delete every stored session of a user: they are signed out on their next request. */
export async function endSessionsOf(db: Db, userId: number): Promise<number> {
  const deleted = await db.delete(session).where(eq(session.userId, userId)).returning({ sid: session.sid });
  return deleted.length;
}

/** One line for the audit trail naming what an admin changed on a user. */
function describeUserChange(u: UserRecord, input: UpdateUserInput): string {
  const parts: string[] = [];
  if (input.roles) parts.push(`roles ${u.roles.join(", ")} → ${[...new Set(input.roles)].join(", ")}`);
  if (input.active === false && u.active) parts.push("deactivated");
  if (input.active === true && !u.active) parts.push("reactivated");
  if (input.displayName !== undefined && input.displayName !== u.displayName)
    parts.push("display name changed");
  return `Updated user ${u.username}: ${parts.length > 0 ? parts.join("; ") : "no visible change"}`;
}

/** Update name, roles or active flag; an admin cannot deactivate, de-admin or grant roles to themself. */
export async function updateUser(db: Db, actorId: number, id: number, input: UpdateUserInput): Promise<User> {
  const existing = await findUserById(db, id);
  if (!existing) throw new HttpError("not_found", "No such user");
  if (actorId === id && input.active === false) {
    throw new HttpError("conflict", "You cannot deactivate your own account");
  }
  if (actorId === id && input.roles && !input.roles.includes("admin")) {
    throw new HttpError("conflict", "You cannot remove your own admin role");
  }
  const granted = (input.roles ?? []).filter((r) => !existing.roles.includes(r));
  if (actorId === id && granted.length > 0) {
    // Separation of duties: a role one holds is granted by someone else.
    throw new HttpError(
      "forbidden",
      `You cannot grant yourself a role (${granted.join(", ")}): another admin must do it`,
      { reason: "self_grant", roles: granted },
    );
  }
  await db.transaction(async (tx) => {
    const set: Partial<typeof users.$inferInsert> = {};
    if (input.displayName !== undefined) set.displayName = input.displayName;
    if (input.active !== undefined) set.active = input.active;
    if (Object.keys(set).length > 0) await tx.update(users).set(set).where(eq(users.id, id));
    if (input.roles) {
      await tx.delete(userRoles).where(eq(userRoles.userId, id));
      await tx.insert(userRoles).values([...new Set(input.roles)].map((role) => ({ userId: id, role })));
    }
    if (input.active === false) await tx.delete(session).where(eq(session.userId, id));
    await recordAudit(tx, {
      action: "user.update",
      subjectType: "user",
      subjectId: id,
      summary: describeUserChange(existing, input),
      details: {
        username: existing.username,
        before: { displayName: existing.displayName, roles: existing.roles, active: existing.active },
        after: input,
      },
    });
  });
  const updated = await findUserById(db, id);
  if (!updated) throw new HttpError("not_found", "No such user");
  return toUser(updated);
}

/** Number of user accounts (active and not). */
export async function countUsers(db: Db): Promise<number> {
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(users);
  return row?.n ?? 0;
}

/** Number of stored, unexpired sessions that belong to a signed-in user. */
export async function countActiveSessions(db: Db): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(session)
    .where(and(sql`${session.expire} > now()`, sql`${session.userId} is not null`));
  return row?.n ?? 0;
}

/** Do all these user ids exist? Returns the missing ones. */
export async function missingUserIds(db: Db, ids: number[]): Promise<number[]> {
  if (ids.length === 0) return [];
  const found = await db.select({ id: users.id }).from(users).where(inArray(users.id, ids));
  const have = new Set(found.map((r) => r.id));
  return ids.filter((id) => !have.has(id));
}
