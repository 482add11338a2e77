import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReleaseListSchema } from "@shared/schemas/releases";
import { api } from "@/lib/api-client";
import { designReleaseKeys } from "./keys";

/** GET /api/designs/:id/releases: every release of a design, newest first, withdrawn included. */
export const designReleasesQueryOptions = (designId: number) =>
  queryOptions({
    queryKey: designReleaseKeys.list(designId),
    queryFn: async ({ signal }) =>
      (await api(`/designs/${designId}/releases`, { schema: ReleaseListSchema, signal })).releases,
  });

/** A design's releases for its timeline. */
export function useDesignReleases(designId: number) {
  return useQuery(designReleasesQueryOptions(designId));
}
