import { queryOptions, useQuery } from "@tanstack/react-query";
import { RevisionDetailSchema } from "@shared/schemas/designs";
import { revisionKeys } from "@/features/designs/api/keys";
import { api } from "@/lib/api-client";

/** GET /api/revisions/:id (404 for non-members). */
export const revisionQueryOptions = (id: number) =>
  queryOptions({
    queryKey: revisionKeys.detail(id),
    queryFn: ({ signal }) => api(`/revisions/${id}`, { schema: RevisionDetailSchema, signal }),
  });

/** One revision: content, tables, uploads and whether this user may edit it. */
export function useRevision(id: number) {
  return useQuery(revisionQueryOptions(id));
}
