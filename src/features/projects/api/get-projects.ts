import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { ProjectSchema } from "@shared/schemas/projects";
import { api } from "@/lib/api-client";
import { projectKeys } from "./keys";

const ProjectsSchema = z.object({ projects: z.array(ProjectSchema) });

/** GET /api/projects: the projects this user may see (admin: all). */
export const projectsQueryOptions = () =>
  queryOptions({
    queryKey: projectKeys.list(),
    queryFn: ({ signal }) => api("/projects", { schema: ProjectsSchema, signal }).then((r) => r.projects),
  });

/** The visible projects. */
export function useProjects() {
  return useQuery(projectsQueryOptions());
}
