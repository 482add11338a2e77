import { QueryClientProvider } from "@tanstack/react-query";
import { RouterProvider } from "react-router-dom";
import { ToastProvider } from "@/components/ui/toast";
import { createQueryClient, setUnauthenticatedHandler } from "@/lib/query-client";
import { router } from "./router";

const queryClient = createQueryClient();

setUnauthenticatedHandler(() => {
  const { pathname, search } = router.state.location;
  if (pathname === "/sign-in") return;
  // Forget the old session's data, then come back here after signing in.
  queryClient.clear();
  void router.navigate(`/sign-in?next=${encodeURIComponent(pathname + search)}`, { replace: true });
});

/** Providers and the router. */
export function App() {
  return (
    <QueryClientProvider client={queryClient}>
      <ToastProvider>
        <RouterProvider router={router} />
      </ToastProvider>
    </QueryClientProvider>
  );
}
