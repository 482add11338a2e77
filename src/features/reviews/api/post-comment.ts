import { useMutation, useQueryClient } from "@tanstack/react-query";
import { CommentResponseSchema, type CommentInput } from "@shared/schemas/reviews";
import { api } from "@/lib/api-client";
import { reviewKeys } from "./keys";

/** POST /api/revisions/:id/comments: one plain-text comment on the revision's thread. */
export function usePostComment(revisionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CommentInput) =>
      api(`/revisions/${revisionId}/comments`, {
        method: "POST",
        body: input,
        schema: CommentResponseSchema,
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.page(revisionId) }),
  });
}
