import { randomBytes } from "node:crypto";
import { cpuPool } from "../jobs/cpu-pool";

/** bcrypt cost factor; issue 2 asks for at least 12. */
export const BCRYPT_COST = 12;

/** Hash a password with bcrypt at BCRYPT_COST, in a CPU thread (about a second of work at cost 12). */
export function hashPassword(password: string): Promise<string> {
  return cpuPool().run("hashPassword", { password, cost: BCRYPT_COST });
}

/** bcrypt comparison in a CPU thread. */
function compare(password: string, hash: string): Promise<boolean> {
  return cpuPool().run("comparePassword", { password, hash });
}

let dummyHash: Promise<string> | undefined;

/**
 * Compare a password with a stored hash; with no hash (unknown user) compare against a dummy one,
 * so an unknown user name costs the same time as a wrong password.
 */
export async function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  if (hash === undefined) {
    dummyHash ??= hashPassword(randomBytes(16).toString("hex"));
    await compare(password, await dummyHash);
    return false;
  }
  return compare(password, hash);
}

// No look-alike characters (0/O, 1/l/I), so a temporary password survives being read aloud.
const ALPHABET = "abcdefghijkmnopqrstuvwxyzABCDEFGHJKLMNPQRSTUVWXYZ23456789";

/** A random temporary password of 16 characters (about 93 bits). */
export function generateTemporaryPassword(length = 16): string {
  const bytes = randomBytes(length * 2);
  let out = "";
  // Rejection sampling keeps every character equally likely.
  for (const b of bytes) {
    if (b < 256 - (256 % ALPHABET.length)) out += ALPHABET[b % ALPHABET.length];
    if (out.length === length) return out;
  }
  return out + generateTemporaryPassword(length - out.length);
}
