import passport from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import { sql } from "drizzle-orm";
import type { Role, SessionUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import { checkCredentials, toSessionUser } from "../services/users";
import "./types";

// Every signed-in request needs its user: one query (user and roles together) whose answer is kept for a
// moment, since a page load fires several requests at once. Every request that may change something (any
// method but GET/HEAD/OPTIONS) drops every kept answer when it ends (server/app.ts), so a change to a user's
// roles, activity or password in this process applies to the very next request; a change made by another
// process shows here within USER_TTL_MS.
const USER_TTL_MS = 2000;
let userGeneration = 0;
/** Drop every kept user (after a request that may have changed one). */
export function forgetSessionUsers(): void {
  userGeneration += 1;
}

const ROLE_ORDER: Record<Role, number> = { admin: 0, author: 1, reviewer: 2, firmware: 3 };

/** The active user with this id as the session sees it, or undefined (missing or deactivated). */
async function activeSessionUser(db: Db, id: number): Promise<SessionUser | undefined> {
  const { rows } = await db.execute<{
    id: number;
    username: string;
    display_name: string;
    email: string;
    must_change_password: boolean;
    roles: Role[];
  }>(sql`select u.id, u.username, u.display_name, u.email, u.must_change_password,
      coalesce(array_agg(r.role::text) filter (where r.role is not null), '{}') as roles
    from users u left join user_roles r on r.user_id = u.id
    where u.id = ${id} and u.active group by u.id`);
  const u = rows[0];
  if (!u) return undefined;
  return {
    id: u.id,
    username: u.username,
    displayName: u.display_name,
    email: u.email,
    roles: [...u.roles].sort((a, b) => ROLE_ORDER[a] - ROLE_ORDER[b]),
    mustChangePassword: u.must_change_password,
  };
}

/** One passport instance (passport's own type for `new Authenticator()`). */
export type Passport = InstanceType<passport.PassportStatic["Authenticator"]>;

/** Why a local sign-in failed, passed to the route as passport's `info`. */
export interface SignInFailure {
  reason: "bad_credentials" | "deactivated";
}

/**
 * A passport instance of its own per app (not the module singleton), so two apps in one process
 * (the session-restart test) do not share strategies.
 */
export function createPassport(db: Db): Passport {
  const pp = new passport.Authenticator();
  pp.use(
    new LocalStrategy((username, password, done) => {
      checkCredentials(db, username, password).then(
        (r) =>
          r.ok
            ? done(null, toSessionUser(r.user))
            : done(null, false, { message: r.reason, reason: r.reason } as SignInFailure & {
                message: string;
              }),
        (err: unknown) => done(err),
      );
    }),
  );
  // Only the id goes into the session row; the session table's user_id column is computed from it.
  pp.serializeUser((user, done) => done(null, user.id));
  const kept = new Map<number, { at: number; generation: number; user: Promise<SessionUser | undefined> }>();
  pp.deserializeUser((id: unknown, done) => {
    if (typeof id !== "number") return done(null, false);
    const now = Date.now();
    let entry = kept.get(id);
    if (!entry || entry.generation !== userGeneration || now - entry.at > USER_TTL_MS) {
      if (kept.size >= 1000) kept.clear();
      entry = { at: now, generation: userGeneration, user: activeSessionUser(db, id) };
      kept.set(id, entry);
      const mine = entry;
      mine.user.catch(() => kept.get(id) === mine && kept.delete(id));
    }
    entry.user.then(
      // A deactivated user's session is worth nothing even if a row survived.
      (u) => done(null, u ? { ...u, roles: [...u.roles] } : false),
      (err: unknown) => done(err),
    );
  });
  return pp;
}
