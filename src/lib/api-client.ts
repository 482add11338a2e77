import type { z } from "zod";
import { ApiErrorBodySchema } from "@shared/schemas/errors";

/** A failed API call: the HTTP status plus the server's `{ error: { code, message, details } }`. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;
  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

/** True when the error means "no session": the caches send the user to sign in. */
export function isUnauthenticated(err: unknown): boolean {
  return err instanceof ApiError && err.status === 401;
}

type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

interface RequestOptions<S extends z.ZodType | undefined> {
  method?: Method;
  body?: unknown;
  /** Parses the 2xx body; omit for 204 answers. */
  schema?: S;
  signal?: AbortSignal;
}

type Result<S> = S extends z.ZodType ? z.infer<S> : undefined;

async function readJson(res: Response): Promise<unknown> {
  const text = await res.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

/**
 * The one fetch client: same-origin JSON with the session cookie, answers validated by the shared zod
 * schemas. It never redirects or toasts; the QueryCache/MutationCache decide that from the ApiError.
 */
export async function api<S extends z.ZodType | undefined = undefined>(
  path: string,
  { method = "GET", body, schema, signal }: RequestOptions<S> = {},
): Promise<Result<S>> {
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method,
      credentials: "same-origin",
      headers:
        body === undefined
          ? { Accept: "application/json" }
          : { Accept: "application/json", "Content-Type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    throw new ApiError(0, "network", "The server could not be reached");
  }
  const json = await readJson(res);
  if (!res.ok) {
    const parsed = ApiErrorBodySchema.safeParse(json);
    if (parsed.success) {
      const e = parsed.data.error;
      throw new ApiError(res.status, e.code, e.message, e.details);
    }
    throw new ApiError(res.status, "internal", `The server answered ${res.status} ${res.statusText}`.trim());
  }
  if (!schema) return undefined as Result<S>;
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    // A contract mismatch is a bug on one side: say where, rather than render half-valid data.
    throw new ApiError(
      res.status,
      "bad_response",
      `Unexpected answer from ${method} /api${path}`,
      parsed.error.issues,
    );
  }
  return parsed.data as Result<S>;
}

/** Field errors from a 400 validation_failed answer, keyed by the first path segment. */
export function fieldErrors(err: unknown): Record<string, string> {
  if (!(err instanceof ApiError) || !Array.isArray(err.details)) return {};
  const out: Record<string, string> = {};
  for (const issue of err.details as unknown[]) {
    if (typeof issue !== "object" || issue === null) continue;
    const { path, message } = issue as { path?: unknown; message?: unknown };
    const key = Array.isArray(path) && path.length > 0 ? String(path[0]) : "";
    if (key && typeof message === "string" && !(key in out)) out[key] = message;
  }
  return out;
}
