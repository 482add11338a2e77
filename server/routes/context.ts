import type { Passport } from "../auth/passport";
import type { Db } from "../db/client";

/** What route modules need from the app: the database, passport and the running version. */
export interface RouteContext {
  db: Db;
  passport: Passport;
  version: string;
  /** Sign-in attempts allowed per minute per IP and user name. */
  signInLimitPerMinute: number;
  /** Sign-in attempts allowed per minute per IP over all user names. */
  signInLimitPerAddressPerMinute: number;
}
