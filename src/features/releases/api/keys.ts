import type { ReleaseListQuery } from "@shared/schemas/releases";

/**
 * Query keys of the firmware release pages. The root "releases" is the one the release and withdraw
 * mutations invalidate, so lists, details and diffs refresh after either.
 */
export const releaseKeys = {
  all: ["releases"] as const,
  lists: () => [...releaseKeys.all, "list"] as const,
  list: (filters: ReleaseListQuery) => [...releaseKeys.lists(), filters] as const,
  detail: (id: number) => [...releaseKeys.all, "detail", id] as const,
  diff: (id: number, against: number) => [...releaseKeys.all, "diff", id, against] as const,
};
