import { useMutation, useQueryClient } from "@tanstack/react-query";
import { TransitionResponseSchema, type DecisionInput } from "@shared/schemas/reviews";
import { designKeys, revisionKeys } from "@/features/designs/api/keys";
import { homeKeys } from "@/features/home/api/get-home";
import { api } from "@/lib/api-client";
import { reviewKeys } from "./keys";

/** POST /api/revisions/:id/decision: approve or request changes, bound to the content and report hashes. */
export function useDecide(revisionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: DecisionInput) =>
      api(`/revisions/${revisionId}/decision`, {
        method: "POST",
        body: input,
        schema: TransitionResponseSchema,
      }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: reviewKeys.all });
      void qc.invalidateQueries({ queryKey: revisionKeys.detail(revisionId) });
      void qc.invalidateQueries({ queryKey: designKeys.all });
      void qc.invalidateQueries({ queryKey: homeKeys.all });
    },
  });
}
