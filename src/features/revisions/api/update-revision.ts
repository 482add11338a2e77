import { useMutation, useQueryClient } from "@tanstack/react-query";
import { RevisionDetailSchema, type RevisionContentInput } from "@shared/schemas/designs";
import { designKeys, revisionKeys } from "@/features/designs/api/keys";
import { api } from "@/lib/api-client";

/** PATCH /api/revisions/:id (drafts only): new content; the server re-materializes the tables. */
export function useUpdateRevision(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (content: RevisionContentInput) =>
      api(`/revisions/${id}`, { method: "PATCH", body: { content }, schema: RevisionDetailSchema }),
    onSuccess: (detail) => {
      qc.setQueryData(revisionKeys.detail(id), detail);
      void qc.invalidateQueries({ queryKey: designKeys.all });
    },
  });
}
