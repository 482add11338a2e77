import { useMutation, useQueryClient } from "@tanstack/react-query";
import { CreatedDesignSchema, type CreateDesignInput } from "@shared/schemas/designs";
import { api } from "@/lib/api-client";
import { designKeys } from "./keys";

/** POST /api/projects/:projectId/designs: the design and its r1 draft, tables generated on the server. */
export function createDesign(projectId: number, body: CreateDesignInput) {
  return api(`/projects/${projectId}/designs`, { method: "POST", body, schema: CreatedDesignSchema });
}

/** Creates a design; the project's list is refetched on success. */
export function useCreateDesign(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateDesignInput) => createDesign(projectId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: designKeys.list(projectId) }),
  });
}
