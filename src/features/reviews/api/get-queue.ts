import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReviewQueueSchema } from "@shared/schemas/reviews";
import { api } from "@/lib/api-client";
import { reviewKeys } from "./keys";

/** GET /api/reviews/queue: in-review revisions of my projects, oldest submission first (reviewers only). */
export const reviewQueueQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.queue(),
    queryFn: async ({ signal }) => (await api("/reviews/queue", { schema: ReviewQueueSchema, signal })).items,
  });

/** The reviewer's queue; `enabled` false for users without the reviewer role (the server answers 403). */
export function useReviewQueue(enabled = true) {
  return useQuery({ ...reviewQueueQueryOptions(), enabled });
}
