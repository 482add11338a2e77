/**
 * The server's log: one lean JSON line per request (method, URL, status, time; no header dump), 4xx at info
 * (a refused request is the client's business, not an operator's), 5xx at error. Credentials never reach a
 * line: the Authorization and Cookie headers, Set-Cookie, password fields, and any API token secret (`tw_…`)
 * wherever it appears (a URL, a message, an error) are replaced before the line is written.
 */
import type { IncomingMessage, ServerResponse } from "node:http";
import pino, { type DestinationStream, type Logger } from "pino";
import { pinoHttp, type Options } from "pino-http";

const REDACTED = "[redacted]";

// A token secret is "tw_" + 43 base64url characters; ten or more after the prefix is treated as a secret
// (the 5-character prefix shown beside a token stays readable).
const TOKEN_SECRET = /tw_[A-Za-z0-9_-]{10,}/g;

/** Replace every API token secret in a text. */
export function scrubSecrets(text: string): string {
  return text.replace(TOKEN_SECRET, `tw_${REDACTED}`);
}

/** Paths pino blanks in every line (as objects reach the logger). */
export const REDACT_PATHS = [
  "req.headers.authorization",
  "req.headers.cookie",
  'res.headers["set-cookie"]',
  "req.body.password",
  "req.body.currentPassword",
  "req.body.newPassword",
  "headers.authorization",
  "headers.cookie",
  "authorization",
  "cookie",
  "password",
];

/** The process logger; `destination` lets tests read the lines. */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = {
    level,
    redact: { paths: REDACT_PATHS, censor: REDACTED },
    // The last step before a line is written: no token secret survives, whatever field it is in.
    hooks: { streamWrite: scrubSecrets },
  };
  return destination ? pino(options, destination) : pino(options);
}

/** What a request line says about the request: no headers, no body. */
function requestSummary(req: IncomingMessage & { id?: unknown; originalUrl?: string }) {
  return { id: req.id, method: req.method, url: scrubSecrets(req.originalUrl ?? req.url ?? "") };
}

/** The request-logging middleware over a logger. */
export function requestLogger(logger: Logger) {
  const options: Options<IncomingMessage, ServerResponse> = {
    logger,
    autoLogging: { ignore: (req) => req.url === "/api/health" },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? "error" : "info"),
    serializers: {
      req: requestSummary,
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
    // Keep pino-http from attaching its raw-object serializers (which would bring the headers back).
    wrapSerializers: false,
  };
  return pinoHttp(options);
}
