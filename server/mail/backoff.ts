/** Retry policy of the mail dispatcher. */
export interface BackoffPolicy {
  /** Delay after the first failed attempt, in seconds. */
  baseSeconds: number;
  /** Upper bound on any single delay, in seconds. */
  maxSeconds: number;
  /** Attempts in all; after the last one fails the row is marked failed. */
  maxAttempts: number;
}

/** 30 s, 1 min, 2 min … capped at an hour, 8 attempts: about 2 h of trying (common practice for outboxes). */
export const DEFAULT_BACKOFF: BackoffPolicy = { baseSeconds: 30, maxSeconds: 3600, maxAttempts: 8 };

/**
 * Seconds to wait after failed attempt number `attempts` (1-based): base·2^(attempts−1), capped; null
 * when no attempt is left. Deterministic (no jitter) so tests and operators can predict it.
 */
export function retryDelaySeconds(attempts: number, policy: BackoffPolicy = DEFAULT_BACKOFF): number | null {
  if (!Number.isInteger(attempts) || attempts < 1)
    throw new RangeError(`attempts must be a positive integer, got ${attempts}`);
  if (attempts >= policy.maxAttempts) return null;
  return Math.min(policy.maxSeconds, policy.baseSeconds * 2 ** (attempts - 1));
}
