import { queryOptions, useQuery } from "@tanstack/react-query";
import { NextVersionsSchema } from "@shared/schemas/releases";
import { designReleaseKeys } from "@/features/reviews/api/keys";
import { api } from "@/lib/api-client";

/** GET /api/designs/:id/next-versions: next patch/minor/major after the highest version ever used. */
export const nextVersionsQueryOptions = (designId: number) =>
  queryOptions({
    queryKey: designReleaseKeys.nextVersions(designId),
    queryFn: ({ signal }) =>
      api(`/designs/${designId}/next-versions`, { schema: NextVersionsSchema, signal }),
    // A withdrawn or new release elsewhere moves the suggestions; ask again each time the dialog opens.
    staleTime: 0,
  });

/** The version chips of the release dialog. */
export function useNextVersions(designId: number, enabled = true) {
  return useQuery({ ...nextVersionsQueryOptions(designId), enabled });
}
