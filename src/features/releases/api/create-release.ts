import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ReleaseResponseSchema, type CreateReleaseInput } from "@shared/schemas/releases";
import { designKeys, revisionKeys } from "@/features/designs/api/keys";
import { homeKeys } from "@/features/home/api/get-home";
import { designReleaseKeys, reviewKeys } from "@/features/reviews/api/keys";
import { api } from "@/lib/api-client";
import { releaseKeys } from "./keys";

/** POST /api/revisions/:id/release: an approved revision becomes version X.Y.Z; its bundle is built once. */
export function useCreateRelease(revisionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateReleaseInput) =>
      api(`/revisions/${revisionId}/release`, {
        method: "POST",
        body: input,
        schema: ReleaseResponseSchema,
      }).then((r) => r.release),
    onSuccess: () => {
      for (const key of [
        designReleaseKeys.all,
        reviewKeys.all,
        revisionKeys.detail(revisionId),
        designKeys.all,
        homeKeys.all,
        releaseKeys.all,
      ])
        void qc.invalidateQueries({ queryKey: key });
    },
  });
}
