import { queryOptions, useQuery } from "@tanstack/react-query";
import { DesignListSchema } from "@shared/schemas/designs";
import { api } from "@/lib/api-client";
import { designKeys } from "./keys";

/** GET /api/projects/:projectId/designs (404 for non-members). */
export const designsQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: designKeys.list(projectId),
    queryFn: ({ signal }) =>
      api(`/projects/${projectId}/designs`, { schema: DesignListSchema, signal }).then((r) => r.designs),
  });

/** The designs of one project. */
export function useDesigns(projectId: number) {
  return useQuery(designsQueryOptions(projectId));
}
