/** Query keys for designs: a project's list and each design's detail are invalidated separately. */
export const designKeys = {
  all: ["designs"] as const,
  lists: () => [...designKeys.all, "list"] as const,
  list: (projectId: number) => [...designKeys.lists(), projectId] as const,
  details: () => [...designKeys.all, "detail"] as const,
  detail: (id: number) => [...designKeys.details(), id] as const,
};

/** Query keys for revisions and their coefficient values (values are immutable per table id). */
export const revisionKeys = {
  all: ["revisions"] as const,
  detail: (id: number) => [...revisionKeys.all, "detail", id] as const,
  values: (tableId: number) => [...revisionKeys.all, "values", tableId] as const,
};

/** Query keys for uploads (an upload never changes once stored). */
export const uploadKeys = {
  all: ["uploads"] as const,
  detail: (id: number) => [...uploadKeys.all, "detail", id] as const,
};
