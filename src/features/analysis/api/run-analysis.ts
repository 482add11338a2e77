import { useMutation, useQueryClient } from "@tanstack/react-query";
import { AnalysisResponseSchema } from "@shared/schemas/analyses";
import { api } from "@/lib/api-client";
import { analysisKeys } from "./keys";

/** POST /api/revisions/:id/analysis → 202: enqueues (or returns the existing analysis; a failed one is re-queued). */
export function useRunAnalysis(revisionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async () =>
      (await api(`/revisions/${revisionId}/analysis`, { method: "POST", schema: AnalysisResponseSchema }))
        .analysis,
    onSuccess: (analysis) => {
      // Seeding the cache starts the polling at once (refetchInterval reads the new state).
      qc.setQueryData(analysisKeys.status(revisionId), analysis);
      void qc.invalidateQueries({ queryKey: analysisKeys.report(revisionId) });
    },
  });
}
