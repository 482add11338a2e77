import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReviewPageSchema } from "@shared/schemas/reviews";
import { api } from "@/lib/api-client";
import { reviewKeys } from "./keys";

/** GET /api/revisions/:id/review: report summary, previous release, thread, decisions, allowed actions. */
export const reviewPageQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: reviewKeys.page(revisionId),
    queryFn: ({ signal }) => api(`/revisions/${revisionId}/review`, { schema: ReviewPageSchema, signal }),
    // The thread and the allowed actions change under other people's hands: never trust an old copy.
    staleTime: 0,
  });

/** One revision's review page. */
export function useReviewPage(revisionId: number) {
  return useQuery(reviewPageQueryOptions(revisionId));
}
