import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

/** POST /api/auth/sign-out, then forget every cached answer. */
export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api("/auth/sign-out", { method: "POST" }),
    onSettled: () => qc.clear(),
  });
}
