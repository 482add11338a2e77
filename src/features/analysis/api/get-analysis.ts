import { queryOptions, useQuery } from "@tanstack/react-query";
import { AnalysisResponseSchema, type AnalysisStatus } from "@shared/schemas/analyses";
import { api } from "@/lib/api-client";
import { analysisKeys } from "./keys";

/** How often a queued or running analysis is polled, ms. */
export const POLL_MS = 1000;

/** Poll while the worker may still change the answer; stop once it is done, failed or absent. */
export function pollInterval(analysis: AnalysisStatus | null | undefined): number | false {
  return analysis && (analysis.state === "queued" || analysis.state === "running") ? POLL_MS : false;
}

/** GET /api/revisions/:id/analysis: the analysis of the revision's current content hash, or null. */
export const analysisQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: analysisKeys.status(revisionId),
    queryFn: async ({ signal }) =>
      (await api(`/revisions/${revisionId}/analysis`, { schema: AnalysisResponseSchema, signal })).analysis,
    staleTime: 0,
    refetchInterval: (query) => pollInterval(query.state.data),
    // Keep polling in a background tab: the toast on completion should not wait for the user to return.
    refetchIntervalInBackground: true,
  });

/** The revision's analysis status, polled while queued or running. */
export function useAnalysis(revisionId: number) {
  return useQuery(analysisQueryOptions(revisionId));
}
