import type { AuditFilter } from "@shared/schemas/audit";

/** The audit page's filters as kept in the URL: dates as `YYYY-MM-DD` in the viewer's zone. */
export interface AuditUrlState {
  projectId: string;
  userId: string;
  action: string;
  from: string;
  to: string;
  before: string;
}

const KEYS = ["projectId", "userId", "action", "from", "to", "before"] as const;

/** Read the page state from the query string; unknown or empty values become "". */
export function readAuditUrl(params: URLSearchParams): AuditUrlState {
  const get = (k: (typeof KEYS)[number]) => params.get(k)?.trim() ?? "";
  return {
    projectId: get("projectId"),
    userId: get("userId"),
    action: get("action"),
    from: get("from"),
    to: get("to"),
    before: get("before"),
  };
}

/** Write the page state back, leaving out empty values so links stay short. */
export function writeAuditUrl(s: AuditUrlState): URLSearchParams {
  const p = new URLSearchParams();
  for (const k of KEYS) if (s[k] !== "") p.set(k, s[k]);
  return p;
}

/** Local midnight of a `YYYY-MM-DD` date as an ISO instant; `endOfDay` gives the last millisecond. */
export function localDayToIso(day: string, endOfDay = false): string | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  if (!m) return undefined;
  const d = endOfDay
    ? new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]), 23, 59, 59, 999)
    : new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  return Number.isNaN(d.getTime()) ? undefined : d.toISOString();
}

/** The API's filter for a URL state (the `to` day is inclusive). */
export function toApiFilter(s: AuditUrlState): AuditFilter {
  const id = (v: string) => (/^\d+$/.test(v) ? Number(v) : undefined);
  return {
    project: id(s.projectId),
    user: id(s.userId),
    action: s.action === "" ? undefined : s.action,
    from: localDayToIso(s.from),
    to: localDayToIso(s.to, true),
  };
}

/** A query string for the API from a filter (plus an optional cursor and page size). */
export function apiQuery(f: AuditFilter, extra: Record<string, string | number | undefined> = {}): string {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries({ ...f, ...extra }))
    if (v !== undefined && v !== "") p.set(k, String(v));
  return p.toString();
}
