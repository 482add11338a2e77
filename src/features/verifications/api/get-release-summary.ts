import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { ReleaseSummarySchema } from "@shared/schemas/verifications";
import { api } from "@/lib/api-client";
import { verificationKeys } from "./keys";

const Answer = z.object({ summary: ReleaseSummarySchema });

/** GET /api/releases/:id/summary: tables, vector sets, approvals and the complete file list. */
export const releaseSummaryQueryOptions = (releaseId: number) =>
  queryOptions({
    queryKey: verificationKeys.summary(releaseId),
    queryFn: async ({ signal }) =>
      (await api(`/releases/${releaseId}/summary`, { schema: Answer, signal })).summary,
    // The manifest of a release never changes.
    staleTime: Number.POSITIVE_INFINITY,
  });

/** What a release's manifest states. */
export function useReleaseSummary(releaseId: number) {
  return useQuery(releaseSummaryQueryOptions(releaseId));
}
