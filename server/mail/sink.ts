import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from "smtp-server";
import type { Db } from "../db/client";
import { mailSinkMessages } from "../db/schema";

/** Options of the development/test SMTP sink. */
export interface SinkOptions {
  db: Db;
  /** 0 asks the kernel for a free port (tests). */
  port: number;
  /** Loopback only: the sink accepts mail from anyone who can reach it. */
  host?: "127.0.0.1" | "::1" | "localhost";
  /** Largest message accepted, in bytes (default 10 MiB). */
  maxBytes?: number;
}

/** A running sink. */
export interface MailSink {
  readonly port: number;
  stop(): Promise<void>;
}

function readAll(stream: SMTPServerDataStream): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("error", reject);
    stream.on("end", () => resolve(Buffer.concat(chunks)));
  });
}

/** Parse one received message and store it; exported for tests of the parsing alone. */
export async function storeMessage(
  db: Db,
  session: Pick<SMTPServerSession, "envelope">,
  raw: Buffer,
): Promise<number> {
  const parsed = await simpleParser(raw);
  const from = session.envelope.mailFrom;
  const [row] = await db
    .insert(mailSinkMessages)
    .values({
      envelopeFrom: from ? from.address : "",
      envelopeTo: session.envelope.rcptTo.map((r) => r.address),
      messageId: parsed.messageId ?? null,
      subject: parsed.subject ?? "",
      text: parsed.text ?? "",
      html: parsed.html === false ? null : parsed.html,
      raw: raw.toString("utf8"),
    })
    .returning({ id: mailSinkMessages.id });
  if (!row) throw new Error("sink insert returned no row");
  return row.id;
}

/**
 * Start an SMTP server on loopback that stores every message in mail_sink_messages (no auth, no TLS:
 * it never leaves the host). The SMTP reply is sent only after the row is committed, so a client that
 * got "250 OK" can rely on the message being in the mailbox.
 */
export async function startMailSink(o: SinkOptions): Promise<MailSink> {
  const maxBytes = o.maxBytes ?? 10 * 1024 * 1024;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    hideSTARTTLS: true,
    logger: false,
    size: maxBytes,
    banner: "Tapwright mail sink (development only)",
    onData(stream, session, callback) {
      readAll(stream)
        .then(async (raw) => {
          if (stream.sizeExceeded) throw Object.assign(new Error("message too large"), { responseCode: 552 });
          await storeMessage(o.db, session, raw);
          callback();
        })
        .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
    },
  });
  const host = o.host ?? "127.0.0.1";
  // SMTPServer re-emits its net.Server's errors on itself: a listen error (EADDRINUSE) must be caught there, or
  // the emit without a listener throws and ends the process before the caller can fall back to another port.
  await new Promise<void>((resolve, reject) => {
    const onError = (err: Error) => reject(err);
    server.once("error", onError);
    server.listen(o.port, host, () => {
      server.off("error", onError);
      resolve();
    });
  });
  // Errors after start (a client resetting its connection) must not crash the app.
  server.on("error", () => undefined);
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
