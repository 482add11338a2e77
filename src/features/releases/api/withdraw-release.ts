import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ReleaseResponseSchema, type WithdrawReleaseInput } from "@shared/schemas/releases";
import { homeKeys } from "@/features/home/api/get-home";
import { designReleaseKeys, reviewKeys } from "@/features/reviews/api/keys";
import { api } from "@/lib/api-client";
import { releaseKeys } from "./keys";

/** POST /api/releases/:id/withdraw: flags the release with a reason; it stays readable and downloadable. */
export function useWithdrawRelease(releaseId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: WithdrawReleaseInput) =>
      api(`/releases/${releaseId}/withdraw`, {
        method: "POST",
        body: input,
        schema: ReleaseResponseSchema,
      }).then((r) => r.release),
    onSuccess: () => {
      for (const key of [designReleaseKeys.all, reviewKeys.all, homeKeys.all, releaseKeys.all])
        void qc.invalidateQueries({ queryKey: key });
    },
  });
}
