import { queryOptions, useQuery } from "@tanstack/react-query";
import { VerificationListSchema } from "@shared/schemas/verifications";
import { api } from "@/lib/api-client";
import { verificationKeys } from "./keys";

/** GET /api/releases/:id/verifications, newest first. */
export const verificationsQueryOptions = (releaseId: number) =>
  queryOptions({
    queryKey: verificationKeys.list(releaseId),
    queryFn: async ({ signal }) =>
      (await api(`/releases/${releaseId}/verifications`, { schema: VerificationListSchema, signal }))
        .verifications,
  });

/** A release's verification runs. */
export function useVerifications(releaseId: number) {
  return useQuery(verificationsQueryOptions(releaseId));
}
