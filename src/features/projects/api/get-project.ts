import { queryOptions, useQuery } from "@tanstack/react-query";
import { ProjectDetailSchema } from "@shared/schemas/projects";
import { api } from "@/lib/api-client";
import { projectKeys } from "./keys";

/** GET /api/projects/:id (404 for non-members). */
export const projectQueryOptions = (id: number) =>
  queryOptions({
    queryKey: projectKeys.detail(id),
    queryFn: ({ signal }) => api(`/projects/${id}`, { schema: ProjectDetailSchema, signal }),
  });

/** One project and its members. */
export function useProject(id: number) {
  return useQuery(projectQueryOptions(id));
}
