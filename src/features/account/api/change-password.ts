import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ChangePasswordInput } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

/** POST /api/account/password (204); the session user is refetched so a must-change banner clears. */
export function useChangePassword() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangePasswordInput) => api("/account/password", { method: "POST", body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["auth"] }),
  });
}
