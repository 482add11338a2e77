import { queryOptions, useQuery } from "@tanstack/react-query";
import { ApiErrorBodySchema } from "@shared/schemas/errors";
import { revisionKeys } from "@/features/designs/api/keys";
import { ApiError } from "@/lib/api-client";
import { fromInterleavedBytes, type Samples } from "../lib/signal-views";

/** GET …/tables/:tableId/values as bytes: the JSON client does not read binary bodies. */
async function fetchValues(
  revisionId: number,
  tableId: number,
  signal: AbortSignal,
): Promise<Samples & { sha256: string | null }> {
  const path = `/api/revisions/${revisionId}/tables/${tableId}/values`;
  let res: Response;
  try {
    res = await fetch(path, {
      credentials: "same-origin",
      headers: { Accept: "application/octet-stream" },
      signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    throw new ApiError(0, "network", "The server could not be reached");
  }
  if (!res.ok) {
    const body = ApiErrorBodySchema.safeParse(await res.json().catch(() => undefined));
    if (body.success)
      throw new ApiError(res.status, body.data.error.code, body.data.error.message, body.data.error.details);
    throw new ApiError(res.status, "internal", `The server answered ${res.status} for ${path}`);
  }
  return { ...fromInterleavedBytes(await res.arrayBuffer()), sha256: res.headers.get("X-Values-SHA256") };
}

/** A table's stored values (interleaved little-endian float64 → I and Q); never stale, a table id never changes content. */
export const tableValuesQueryOptions = (revisionId: number, tableId: number) =>
  queryOptions({
    queryKey: revisionKeys.values(tableId),
    queryFn: ({ signal }) => fetchValues(revisionId, tableId, signal),
    staleTime: Infinity,
    gcTime: 60_000,
  });

/** The samples of one coefficient table. */
export function useTableValues(revisionId: number, tableId: number) {
  return useQuery(tableValuesQueryOptions(revisionId, tableId));
}
