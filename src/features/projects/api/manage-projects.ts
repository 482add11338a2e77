import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { ProjectDetailSchema, ProjectSchema, type CreateProjectInput } from "@shared/schemas/projects";
import { api } from "@/lib/api-client";
import { projectKeys } from "./keys";

const ProjectEnvelopeSchema = z.object({ project: ProjectSchema });

/** POST /api/projects (admin): a new, empty project. */
export function useCreateProject() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProjectInput) =>
      api("/projects", { method: "POST", body: input, schema: ProjectEnvelopeSchema }).then((r) => r.project),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: projectKeys.all }),
        qc.invalidateQueries({ queryKey: ["home"] }),
      ]),
  });
}

/** PUT /api/projects/:id/members (admin): the whole member list at once. */
export function useSetMembers(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (userIds: number[]) =>
      api(`/projects/${projectId}/members`, {
        method: "PUT",
        body: { userIds },
        schema: ProjectDetailSchema,
      }),
    onSuccess: (detail) => {
      qc.setQueryData(projectKeys.detail(projectId), detail);
      return Promise.all([
        qc.invalidateQueries({ queryKey: projectKeys.lists() }),
        qc.invalidateQueries({ queryKey: ["home"] }),
      ]);
    },
  });
}
