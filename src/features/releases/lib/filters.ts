/** The release list's filters as they live in the URL (`?project=&design=&status=`), so a link can be shared. */
import { RELEASE_STATUSES, type ReleaseListQuery } from "@shared/schemas/releases";

/** Raw URL values; empty string = no filter. */
export interface ReleaseUrlState {
  project: string;
  design: string;
  status: string;
}

/** Read the filters from the search params. */
export function readReleaseUrl(params: URLSearchParams): ReleaseUrlState {
  return {
    project: params.get("project") ?? "",
    design: params.get("design") ?? "",
    status: params.get("status") ?? "",
  };
}

/** Search params for a state, empty values left out. */
export function writeReleaseUrl(state: ReleaseUrlState): URLSearchParams {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(state)) if (v) p.set(k, v);
  return p;
}

/** The API filter; values that are not valid (a hand-edited URL) are ignored rather than sent. */
export function toReleaseQuery(state: ReleaseUrlState): ReleaseListQuery {
  const q: ReleaseListQuery = {};
  if (state.project) q.project = state.project;
  if (/^[1-9]\d*$/.test(state.design)) q.design = Number(state.design);
  if ((RELEASE_STATUSES as readonly string[]).includes(state.status))
    q.status = state.status as ReleaseListQuery["status"];
  return q;
}
