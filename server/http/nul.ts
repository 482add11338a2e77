/**
 * NUL characters: PostgreSQL text cannot hold U+0000, so one in a URL, a query or a JSON body would fail deep
 * in a query as a 500. Refused at the door with 400 naming where it is.
 */
import type { RequestHandler } from "express";
import { validationFailed, type FieldIssue } from "./errors";

const MESSAGE = "contains a NUL character (U+0000), which is not allowed";

/** Paths (as in validation_failed details) of every string holding a NUL, in a parsed JSON value. */
export function nulPaths(
  value: unknown,
  path: (string | number)[] = [],
  out: FieldIssue[] = [],
): FieldIssue[] {
  if (out.length >= 20) return out;
  if (typeof value === "string") {
    if (value.includes("\u0000")) out.push({ path, message: MESSAGE });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => nulPaths(v, [...path, i], out));
  } else if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (k.includes("\u0000")) out.push({ path: [...path, k], message: `a key ${MESSAGE}` });
      nulPaths(v, [...path, k], out);
    }
  }
  return out;
}

/** 400 for a NUL anywhere in the URL (path or query, percent-encoded or not). */
export const refuseNulInUrl: RequestHandler = (req, _res, next) => {
  if (/%00/i.test(req.originalUrl) || req.originalUrl.includes("\u0000"))
    throw validationFailed([{ path: ["url"], message: `the URL ${MESSAGE}` }], `The URL ${MESSAGE}`);
  next();
};

/** 400 for a NUL in any string (or key) of a JSON body. */
export const refuseNulInBody: RequestHandler = (req, _res, next) => {
  const issues = nulPaths(req.body);
  if (issues.length > 0) throw validationFailed(issues);
  next();
};

/** Whether a text (a multipart field or file name) holds a NUL. */
export function hasNul(text: string): boolean {
  return text.includes("\u0000");
}
