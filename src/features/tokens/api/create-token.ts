import { useMutation, useQueryClient } from "@tanstack/react-query";
import { CreatedTokenSchema, type CreateTokenInput } from "@shared/schemas/tokens";
import { api } from "@/lib/api-client";
import { tokenKeys } from "./keys";

/** POST /api/tokens: answers the secret once; the caller shows it and then forgets it. */
export function useCreateToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTokenInput) =>
      api("/tokens", { method: "POST", body: input, schema: CreatedTokenSchema }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}
