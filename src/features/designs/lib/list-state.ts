/**
 * The designs table's view (search, kind, state, sort) as URL query parameters, so a filtered, sorted view can be
 * linked: `?q=chirp&kind=waveform&state=draft&sort=updated.desc`. Unknown values fall back to the defaults.
 */
import { DESIGN_KINDS, REVISION_STATES, type DesignKind, type RevisionState } from "@shared/schemas/designs";

/** Columns the table sorts by. */
export const SORTABLE = ["name", "kind", "revision", "state", "version", "owner", "updated"] as const;
export type SortColumn = (typeof SORTABLE)[number];

/** What the URL says about the table. */
export interface ListState {
  q: string;
  kind: DesignKind | "";
  state: RevisionState | "";
  sort: { id: SortColumn; desc: boolean };
}

/** Newest change first: what an author returning to a project looks for. */
export const DEFAULT_SORT: ListState["sort"] = { id: "updated", desc: true };

const oneOf = <T extends string>(list: readonly T[], v: string | null): T | "" =>
  (list as readonly string[]).includes(v ?? "") ? (v as T) : "";

/** Reads the table's view from the query string. */
export function readListState(params: URLSearchParams): ListState {
  const [id, dir] = (params.get("sort") ?? "").split(".");
  const col = oneOf(SORTABLE, id ?? null);
  return {
    q: params.get("q") ?? "",
    kind: oneOf(DESIGN_KINDS, params.get("kind")),
    state: oneOf(REVISION_STATES, params.get("state")),
    sort: col ? { id: col, desc: dir === "desc" } : DEFAULT_SORT,
  };
}

/** Writes the view back, leaving other parameters alone and defaults out of the URL. */
export function writeListState(params: URLSearchParams, s: ListState): URLSearchParams {
  const next = new URLSearchParams(params);
  const put = (k: string, v: string) => (v ? next.set(k, v) : next.delete(k));
  put("q", s.q);
  put("kind", s.kind);
  put("state", s.state);
  const isDefault = s.sort.id === DEFAULT_SORT.id && s.sort.desc === DEFAULT_SORT.desc;
  put("sort", isDefault ? "" : `${s.sort.id}.${s.sort.desc ? "desc" : "asc"}`);
  return next;
}

/** "just now", "5 min ago", "3 h ago", "2 d ago", else the date: how long since `iso`, seen from `now`. */
export function relativeTime(iso: string, now: number = Date.now()): string {
  const t = new Date(iso).getTime();
  if (Number.isNaN(t)) return "—";
  const s = Math.max(0, Math.round((now - t) / 1000));
  if (s < 45) return "just now";
  if (s < 3600) return `${Math.max(1, Math.round(s / 60))} min ago`;
  if (s < 86_400) return `${Math.round(s / 3600)} h ago`;
  if (s < 30 * 86_400) return `${Math.round(s / 86_400)} d ago`;
  return iso.slice(0, 10);
}

/** Display names of revision states. */
export const STATE_LABELS: Record<RevisionState, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  changes_requested: "Changes requested",
  released: "Released",
};
