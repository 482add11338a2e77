import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { HomeWorkSchema } from "@shared/schemas/reviews";
import { api } from "@/lib/api-client";
import { homeKeys } from "./get-home";

const HomeWorkResponseSchema = z.object({ work: HomeWorkSchema.optional() });

/** GET /api/home, the review/release part (`work`): under the home key so the same invalidations refresh it. */
export const homeWorkQueryOptions = () =>
  queryOptions({
    queryKey: [...homeKeys.all, "work"] as const,
    queryFn: async ({ signal }) =>
      (await api("/home", { schema: HomeWorkResponseSchema, signal })).work ?? {},
  });

/** What waits for me per role: drafts, changes requested, releases, the review queue size. */
export function useHomeWork() {
  return useQuery(homeWorkQueryOptions());
}
