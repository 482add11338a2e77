/**
 * Per-account back-off for sign-in, alongside the per-address limits of server/routes/auth: after
 * BACKOFF.freeFailures consecutive failures for one user name, each further attempt waits twice as long as the
 * last (from BACKOFF.firstLockSeconds up to BACKOFF.maxLockSeconds), whichever address it comes from. The
 * lock is checked before the password, so a locked name costs no bcrypt time. Counted for unknown names too,
 * so a lock does not tell whether an account exists.
 */
import { eq, sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { signInFailures } from "../db/schema";

/** The back-off settings (common practice: a handful of free tries, then exponential delays). */
export const BACKOFF = {
  freeFailures: 10,
  firstLockSeconds: 15,
  maxLockSeconds: 15 * 60,
  forgetAfterSeconds: 60 * 60,
} as const;

const key = (username: string) => username.trim().toLowerCase().slice(0, 200);

/** Seconds until the user name may try again, or 0. */
export async function lockedForSeconds(db: Db, username: string, now = new Date()): Promise<number> {
  const [row] = await db
    .select({ lockedUntil: signInFailures.lockedUntil })
    .from(signInFailures)
    .where(eq(signInFailures.username, key(username)));
  if (!row?.lockedUntil) return 0;
  return Math.max(0, Math.ceil((row.lockedUntil.getTime() - now.getTime()) / 1000));
}

/** Count a failure; past the free ones, lock the name for a doubling time. */
export async function recordSignInFailure(db: Db, username: string): Promise<void> {
  // Constants of this module, not input: inlined so PostgreSQL knows their types.
  const [freeFailures, firstLockSeconds, maxLockSeconds, forgetAfterSeconds] = [
    BACKOFF.freeFailures,
    BACKOFF.firstLockSeconds,
    BACKOFF.maxLockSeconds,
    BACKOFF.forgetAfterSeconds,
  ].map((v) => sql.raw(String(v)));
  // A run of failures is forgotten after a quiet hour.
  const n = sql`(case when ${signInFailures.lastAt} < now() - make_interval(secs => ${forgetAfterSeconds})
    then 0 else ${signInFailures.failures} end) + 1`;
  await db
    .insert(signInFailures)
    .values({ username: key(username), failures: 1 })
    .onConflictDoUpdate({
      target: signInFailures.username,
      set: {
        failures: n,
        lastAt: sql`now()`,
        lockedUntil: sql`case when ${n} >= ${freeFailures}
          then now() + make_interval(secs => least(${maxLockSeconds}, ${firstLockSeconds} * power(2, ${n} - ${freeFailures})))
          else null end`,
      },
    });
}

/** A successful sign-in clears the count. */
export async function clearSignInFailures(db: Db, username: string): Promise<void> {
  await db.delete(signInFailures).where(eq(signInFailures.username, key(username)));
}
