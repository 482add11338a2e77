import { useMutation, useQueryClient } from "@tanstack/react-query";
import { RevisionDetailSchema } from "@shared/schemas/designs";
import { designKeys, revisionKeys } from "@/features/designs/api/keys";
import { api } from "@/lib/api-client";

/** POST /api/revisions/:id/submit: fixes the content hash and moves the draft to review. */
export function useSubmitRevision(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(`/revisions/${id}/submit`, { method: "POST", schema: RevisionDetailSchema }),
    onSuccess: (detail) => {
      qc.setQueryData(revisionKeys.detail(id), detail);
      void qc.invalidateQueries({ queryKey: designKeys.all });
    },
  });
}
