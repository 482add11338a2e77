import type { ErrorRequestHandler, RequestHandler } from "express";
import type { z } from "zod";
import type { ApiErrorBody, ErrorCode } from "../../shared/schemas/errors";

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  rate_limited: 429,
  internal: 500,
  bundle_corrupt: 500,
  cross_site: 403,
  password_change_required: 403,
  service_unavailable: 503,
};

// Node socket errors and PostgreSQL SQLSTATEs that mean "the database is not there", not "the query is wrong":
// class 08 (connection exception), 57P01..57P03 (shutdown, crash, cannot connect now), 53300 (too many connections).
const DB_DOWN_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ENOTFOUND", "EAI_AGAIN"]);
const DB_DOWN_SQLSTATE = /^(08...|57P0[123]|53300)$/;
const DB_DOWN_MESSAGE = /Connection terminated|connection timeout|Client has encountered a connection error/i;

/** Is this error (or its cause chain) the database being unreachable? */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== "object" || depth > 4) return false;
  const e = err as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (typeof e.code === "string" && (DB_DOWN_CODES.has(e.code) || DB_DOWN_SQLSTATE.test(e.code))) return true;
  if (typeof e.message === "string" && DB_DOWN_MESSAGE.test(e.message)) return true;
  if (Array.isArray(e.errors) && e.errors.some((x) => isDatabaseUnavailable(x, depth + 1))) return true;
  return isDatabaseUnavailable(e.cause, depth + 1);
}

/** The one error type the server throws on purpose; the error middleware turns it into JSON. */
export class HttpError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = "HttpError";
    this.status = STATUS[code];
  }
}

/** One field problem, as the client's forms expect it. */
export interface FieldIssue {
  path: (string | number)[];
  message: string;
}

/** A 400 validation_failed naming the offending fields. */
export function validationFailed(issues: FieldIssue[], message = "Some fields are not valid"): HttpError {
  return new HttpError("validation_failed", message, issues);
}

/** Parse input with a zod schema or throw validation_failed with the issue paths. */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  throw validationFailed(
    result.error.issues.map((i) => ({
      path: i.path.filter((p): p is string | number => typeof p !== "symbol"),
      message: i.message,
    })),
  );
}

/** Build the JSON error body. */
export function errorBody(code: ErrorCode, message: string, details?: unknown): ApiErrorBody {
  return details === undefined ? { error: { code, message } } : { error: { code, message, details } };
}

/** 404 for any /api route nobody answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError("not_found", `No API route for ${req.method} ${req.path}`));
};

interface BodyParserError {
  type?: string;
  status?: number;
}

/** The one error middleware: known errors keep their code, anything else is logged and becomes 500 internal. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  if (err instanceof HttpError) {
    res.status(err.status).json(errorBody(err.code, err.message, err.details));
    return;
  }
  // express.json() rejects malformed or oversized bodies with a typed error carrying a 4xx status.
  const parserError = err as BodyParserError;
  if (parserError?.type === "entity.parse.failed") {
    res.status(400).json(errorBody("bad_request", "The request body is not valid JSON"));
    return;
  }
  if (parserError?.type === "entity.too.large") {
    res.status(413).json(errorBody("bad_request", "The request body is too large"));
    return;
  }
  if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err }, "database unavailable");
    res.setHeader("Retry-After", "10");
    res
      .status(503)
      .json(
        errorBody(
          "service_unavailable",
          "The database is not reachable at the moment, so nothing was read or changed. Try again in a few seconds; if it lasts, tell an administrator.",
        ),
      );
    return;
  }
  req.log?.error({ err }, "unhandled error");
  res.status(500).json(errorBody("internal", "Something went wrong on the server"));
};
