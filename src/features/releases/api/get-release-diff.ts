import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { ReleaseDiffSchema } from "@shared/schemas/release-diff";
import { api } from "@/lib/api-client";
import { releaseKeys } from "./keys";

const ResponseSchema = z.object({ diff: ReleaseDiffSchema });

/** GET /api/releases/:id/diff?against=:other — releases never change, so the answer never goes stale. */
export const releaseDiffQueryOptions = (id: number, against: number) =>
  queryOptions({
    queryKey: releaseKeys.diff(id, against),
    queryFn: async ({ signal }) =>
      (await api(`/releases/${id}/diff?against=${against}`, { schema: ResponseSchema, signal })).diff,
    staleTime: Infinity,
  });

/** The diff of a release against another of the same design; idle while `against` is null. */
export function useReleaseDiff(id: number, against: number | null) {
  return useQuery({ ...releaseDiffQueryOptions(id, against ?? 0), enabled: against !== null });
}
