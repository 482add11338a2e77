import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReleaseListSchema, type ReleaseListQuery } from "@shared/schemas/releases";
import { api } from "@/lib/api-client";
import { releaseKeys } from "./keys";

/** The query string of GET /api/releases, absent filters left out. */
export function releaseListSearch(filters: ReleaseListQuery): string {
  const p = new URLSearchParams();
  if (filters.project) p.set("project", filters.project);
  if (filters.design !== undefined) p.set("design", String(filters.design));
  if (filters.status) p.set("status", filters.status);
  const s = p.toString();
  return s ? `?${s}` : "";
}

/** GET /api/releases: releases in my projects, newest first. */
export const releasesQueryOptions = (filters: ReleaseListQuery) =>
  queryOptions({
    queryKey: releaseKeys.list(filters),
    queryFn: async ({ signal }) =>
      (await api(`/releases${releaseListSearch(filters)}`, { schema: ReleaseListSchema, signal })).releases,
  });

/** Releases matching the filters. */
export function useReleases(filters: ReleaseListQuery) {
  return useQuery(releasesQueryOptions(filters));
}
