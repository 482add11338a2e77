import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReleaseResponseSchema } from "@shared/schemas/releases";
import { api } from "@/lib/api-client";
import { releaseKeys } from "./keys";

/** GET /api/releases/:id (404 outside my projects). */
export const releaseQueryOptions = (id: number) =>
  queryOptions({
    queryKey: releaseKeys.detail(id),
    queryFn: async ({ signal }) =>
      (await api(`/releases/${id}`, { schema: ReleaseResponseSchema, signal })).release,
  });

/** One release for its page. */
export function useRelease(id: number) {
  return useQuery(releaseQueryOptions(id));
}
