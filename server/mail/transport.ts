import nodemailer, { type Transporter } from "nodemailer";
import type SMTPTransport from "nodemailer/lib/smtp-transport";
import type { Env } from "../env";

/** SMTP settings for the dispatcher. */
export interface SmtpSettings {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  pass?: string;
  from: string;
}

/** SMTP settings from the environment; without SMTP_HOST, the local sink on loopback. */
export function smtpSettingsFrom(e: Env, sinkPort: number): SmtpSettings {
  if (e.SMTP_HOST) {
    return {
      host: e.SMTP_HOST,
      port: e.SMTP_PORT ?? (e.SMTP_SECURE ? 465 : 587),
      secure: e.SMTP_SECURE,
      user: e.SMTP_USER,
      pass: e.SMTP_PASS,
      from: e.MAIL_FROM,
    };
  }
  return { host: "127.0.0.1", port: e.SMTP_PORT ?? sinkPort, secure: false, from: e.MAIL_FROM };
}

/** What the dispatcher needs from a transport (nodemailer's, or a fake in unit tests). */
export interface MailSender {
  send(message: { from: string; to: string[]; subject: string; text: string; html?: string }): Promise<void>;
  close(): void;
}

/** A nodemailer SMTP transport; short timeouts so a dead server fails an attempt instead of hanging. */
export function smtpSender(s: SmtpSettings): MailSender {
  const isLoopback = s.host === "127.0.0.1" || s.host === "localhost" || s.host === "::1";
  const options: SMTPTransport.Options = {
    host: s.host,
    port: s.port,
    secure: s.secure,
    auth: s.user ? { user: s.user, pass: s.pass ?? "" } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
    // The loopback sink speaks plain SMTP; anywhere else STARTTLS is required when not implicit TLS.
    ignoreTLS: isLoopback && !s.secure,
    requireTLS: !isLoopback && !s.secure,
  };
  const transport: Transporter<SMTPTransport.SentMessageInfo> = nodemailer.createTransport(options);
  return {
    async send(m) {
      const info = await transport.sendMail({ ...m, html: m.html ?? undefined });
      // A server that accepts none of the recipients has not taken the message.
      if (info.accepted.length === 0) throw new Error(`no recipient accepted: ${info.rejected.join(", ")}`);
    },
    close: () => transport.close(),
  };
}
