import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { ApiError, isUnauthenticated } from "./api-client";

type Handler = () => void;
let onUnauthenticated: Handler = () => {};

/** The router registers how to reach the sign-in page; kept here so the fetch client never navigates. */
export function setUnauthenticatedHandler(handler: Handler): void {
  onUnauthenticated = handler;
}

function handle(err: unknown): void {
  if (isUnauthenticated(err)) onUnauthenticated();
}

/** One QueryClient: a 401 from any query or mutation sends the user to sign in. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({ onError: handle }),
    mutationCache: new MutationCache({ onError: handle }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // Client errors will not fix themselves; retry only what may be transient.
        retry: (count, err) =>
          !(err instanceof ApiError && err.status >= 400 && err.status < 500) && count < 2,
      },
    },
  });
}
