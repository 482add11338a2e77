import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { SessionUserSchema } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";
import { authKeys } from "./keys";

const MeSchema = z.object({ user: SessionUserSchema });

/** GET /api/auth/me: who is signed in (401 when nobody). */
export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => api("/auth/me", { schema: MeSchema, signal }).then((r) => r.user),
    staleTime: 5 * 60_000,
  });

/** The signed-in user. */
export function useMe() {
  return useQuery(meQueryOptions());
}
