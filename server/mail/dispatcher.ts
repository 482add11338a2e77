import type { Logger } from "pino";
import type { Db } from "../db/client";
import { DEFAULT_BACKOFF, retryDelaySeconds, type BackoffPolicy } from "./backoff";
import { claimDue, markAttemptFailed, markSent } from "./outbox";
import type { MailSender } from "./transport";

/** Options of the outbox dispatcher. */
export interface DispatcherOptions {
  db: Db;
  sender: MailSender;
  from: string;
  policy?: BackoffPolicy;
  /** Poll period in ms (default 5 s). */
  intervalMs?: number;
  /** Rows claimed per tick (default 20). */
  batch?: number;
  /** Seconds a claimed row stays hidden from other dispatchers while it is being sent (default 120). */
  leaseSeconds?: number;
  logger?: Logger;
}

/** What one tick did. */
export interface TickResult {
  sent: number;
  retried: number;
  failed: number;
}

/** A running dispatcher. */
export interface Dispatcher {
  /** Send what is due now; ticks never overlap (a second call waits for the running one). */
  tick(): Promise<TickResult>;
  /** Stop polling and wait for a running tick; closes the sender. */
  stop(): Promise<void>;
}

/**
 * Send due outbox rows over SMTP, one message per row, retrying with exponential backoff and marking
 * a row failed after the policy's last attempt. Polls every intervalMs when started with start: true.
 */
export function createDispatcher(o: DispatcherOptions, start = true): Dispatcher {
  const policy = o.policy ?? DEFAULT_BACKOFF;
  const batch = o.batch ?? 20;
  const lease = o.leaseSeconds ?? 120;
  let running: Promise<TickResult> | undefined;
  let stopped = false;

  async function once(): Promise<TickResult> {
    const result: TickResult = { sent: 0, retried: 0, failed: 0 };
    const rows = await claimDue(o.db, batch, lease);
    for (const row of rows) {
      try {
        await o.sender.send({
          from: o.from,
          to: row.toAddresses,
          subject: row.subject,
          text: row.text,
          html: row.html ?? undefined,
        });
        await markSent(o.db, row.id);
        result.sent += 1;
      } catch (err) {
        const message = err instanceof Error ? err.message : String(err);
        const delay = retryDelaySeconds(row.attempts, policy);
        await markAttemptFailed(o.db, row.id, message.slice(0, 2000), delay);
        if (delay === null) result.failed += 1;
        else result.retried += 1;
        o.logger?.warn({ mailId: row.id, attempts: row.attempts, err: message }, "mail attempt failed");
      }
    }
    return result;
  }

  function tick(): Promise<TickResult> {
    const next = (running ?? Promise.resolve(undefined)).catch(() => undefined).then(once);
    running = next;
    return next;
  }

  const timer = start
    ? setInterval(() => {
        if (stopped) return;
        tick().catch((err: unknown) => o.logger?.error({ err }, "mail dispatcher tick failed"));
      }, o.intervalMs ?? 5000)
    : undefined;
  timer?.unref();

  return {
    tick,
    async stop() {
      stopped = true;
      if (timer) clearInterval(timer);
      await running?.catch(() => undefined);
      o.sender.close();
    },
  };
}
