import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { DesignDetailSchema, RevisionSummarySchema } from "@shared/schemas/designs";
import { api } from "@/lib/api-client";
import { designKeys } from "./keys";

/** GET /api/designs/:id (404 for non-members). */
export const designQueryOptions = (id: number) =>
  queryOptions({
    queryKey: designKeys.detail(id),
    queryFn: ({ signal }) => api(`/designs/${id}`, { schema: DesignDetailSchema, signal }),
  });

/** One design with its revisions, newest last as the server lists them. */
export function useDesign(id: number) {
  return useQuery(designQueryOptions(id));
}

const StartedRevisionSchema = z.object({ revision: RevisionSummarySchema });

/**
 * POST /api/designs/:id/revisions: a new draft copied from the latest revision. A 409 means a draft is
 * already open; its id is in the error's details.
 */
export function useStartRevision(designId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () =>
      api(`/designs/${designId}/revisions`, { method: "POST", schema: StartedRevisionSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: designKeys.all }),
  });
}

/** The open draft's revision id from a 409 answer's details (`{ revisionId }` or `{ id }`), if the server gave one. */
export function openDraftId(details: unknown): number | undefined {
  if (typeof details !== "object" || details === null) return undefined;
  const d = details as Record<string, unknown>;
  const id = d.revisionId ?? d.draftId ?? d.id;
  return typeof id === "number" && Number.isInteger(id) ? id : undefined;
}
