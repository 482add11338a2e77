import passport from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { Db } from "../db/client";
import { checkCredentials, findUserById, toSessionUser } from "../services/users";
import "./types";

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
  pp.deserializeUser((id: unknown, done) => {
    if (typeof id !== "number") return done(null, false);
    findUserById(db, id).then(
      // A deactivated user's session is worth nothing even if a row survived.
      (u) => done(null, u && u.active ? toSessionUser(u) : false),
      (err: unknown) => done(err),
    );
  });
  return pp;
}
