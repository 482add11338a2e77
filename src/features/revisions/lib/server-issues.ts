/** A 400 answer's zod issues placed on the form fields they name (paths under `content`). */
import { ApiError } from "@/lib/api-client";

interface Issue {
  path: Array<string | number>;
  message: string;
}

function issuesOf(err: unknown): Issue[] {
  if (!(err instanceof ApiError) || !Array.isArray(err.details)) return [];
  return (err.details as unknown[]).flatMap((d) => {
    if (typeof d !== "object" || d === null) return [];
    const { path, message } = d as { path?: unknown; message?: unknown };
    if (!Array.isArray(path) || typeof message !== "string") return [];
    return [
      {
        path: path.filter((p): p is string | number => typeof p === "string" || typeof p === "number"),
        message,
      },
    ];
  });
}

/**
 * Calls `place(fieldPath, message)` for each issue whose path (without the leading `content`) starts with
 * one of `prefixes`; returns the messages no field took, for a form-level alert.
 */
export function placeServerIssues(
  err: unknown,
  prefixes: readonly string[],
  place: (field: string, message: string) => void,
): string[] {
  const rest: string[] = [];
  for (const { path, message } of issuesOf(err)) {
    const p = path[0] === "content" ? path.slice(1) : path;
    if (typeof p[0] === "string" && prefixes.includes(p[0]) && p.length > 1) place(p.join("."), message);
    else rest.push(p.length ? `${p.join(".")}: ${message}` : message);
  }
  if (rest.length === 0 && issuesOf(err).length === 0 && err instanceof Error) rest.push(err.message);
  return rest;
}
