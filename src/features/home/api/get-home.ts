import { queryOptions, useQuery } from "@tanstack/react-query";
import { HomeSchema } from "@shared/schemas/projects";
import { api } from "@/lib/api-client";

/** Query keys for the home page. */
export const homeKeys = { all: ["home"] as const };

/** GET /api/home: what waits for the signed-in user. */
export const homeQueryOptions = () =>
  queryOptions({
    queryKey: homeKeys.all,
    queryFn: ({ signal }) => api("/home", { schema: HomeSchema, signal }),
  });

/** The home page's data. */
export function useHome() {
  return useQuery(homeQueryOptions());
}
