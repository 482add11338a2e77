import type { Logger } from "pino";
import type { Db } from "../db/client";
import type { Env } from "../env";
import { createDispatcher, type Dispatcher } from "./dispatcher";
import { startMailSink, type MailSink } from "./sink";
import { smtpSender, smtpSettingsFrom } from "./transport";

/** The mail parts running in this process. */
export interface MailRuntime {
  sink?: MailSink;
  dispatcher?: Dispatcher;
  stop(): Promise<void>;
}

let sinkPort: number | null = null;
/** The loopback port of this process's SMTP sink, or null when none runs (shown on the mailbox page). */
export function runningSinkPort(): number | null {
  return sinkPort;
}

/** Is the sink on? Explicit MAIL_SINK wins; otherwise on everywhere but production. */
export function sinkEnabled(e: Env): boolean {
  return e.MAIL_SINK ? e.MAIL_SINK === "on" : e.NODE_ENV !== "production";
}

/** The sink's port: MAIL_SINK_PORT, else 2525, or a free port under NODE_ENV=test. */
export function sinkPortFrom(e: Env): number {
  return e.MAIL_SINK_PORT ?? (e.NODE_ENV === "test" ? 0 : 2525);
}

async function startSinkOrFallback(db: Db, port: number, logger: Logger): Promise<MailSink> {
  try {
    return await startMailSink({ db, port });
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "EADDRINUSE" || port === 0) throw err;
    // Another development server holds the port: take a free one rather than deliver into its sink.
    logger.warn(`mail sink: port ${port} is taken, using a free port instead`);
    return startMailSink({ db, port: 0 });
  }
}

/**
 * Start the SMTP sink (development and tests) and the outbox dispatcher as the environment asks.
 * Without SMTP_HOST the dispatcher delivers to this process's sink.
 */
export async function startMail(e: Env, db: Db, logger: Logger): Promise<MailRuntime> {
  const sink = sinkEnabled(e) ? await startSinkOrFallback(db, sinkPortFrom(e), logger) : undefined;
  if (sink) {
    sinkPort = sink.port;
    logger.info(`mail sink listening on smtp://127.0.0.1:${sink.port}`);
  }
  let dispatcher: Dispatcher | undefined;
  if (e.MAIL_DISPATCH === "on") {
    const settings = smtpSettingsFrom(e, sink?.port ?? sinkPortFrom(e));
    dispatcher = createDispatcher({
      db,
      sender: smtpSender(settings),
      from: settings.from,
      policy: { baseSeconds: 30, maxSeconds: 3600, maxAttempts: e.MAIL_MAX_ATTEMPTS },
      logger,
    });
  }
  return {
    sink,
    dispatcher,
    async stop() {
      await dispatcher?.stop();
      await sink?.stop();
      sinkPort = null;
    },
  };
}
