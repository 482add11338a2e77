import { queryOptions, useQuery } from "@tanstack/react-query";
import { TokenListSchema } from "@shared/schemas/tokens";
import { api } from "@/lib/api-client";
import { tokenKeys } from "./keys";

/** GET /api/tokens: my tokens (never their secrets), revoked ones included. */
export const myTokensQueryOptions = () =>
  queryOptions({
    queryKey: tokenKeys.mine(),
    queryFn: async ({ signal }) => (await api("/tokens", { schema: TokenListSchema, signal })).tokens,
  });

/** My API tokens for the account page. */
export function useMyTokens() {
  return useQuery(myTokensQueryOptions());
}
