/** Query keys for reviews: the queue and each revision's review page are invalidated separately. */
export const reviewKeys = {
  all: ["reviews"] as const,
  queue: () => [...reviewKeys.all, "queue"] as const,
  page: (revisionId: number) => [...reviewKeys.all, "page", revisionId] as const,
};

/** Query keys for a design's releases (the design page timeline and the release dialog's version chips). */
export const designReleaseKeys = {
  all: ["design-releases"] as const,
  list: (designId: number) => [...designReleaseKeys.all, "list", designId] as const,
  nextVersions: (designId: number) => [...designReleaseKeys.all, "next", designId] as const,
};
