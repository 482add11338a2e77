import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { ApiTokenSchema } from "@shared/schemas/tokens";
import { api } from "@/lib/api-client";
import { tokenKeys } from "./keys";

const ResponseSchema = z.object({ token: ApiTokenSchema });

/** POST /api/tokens/:id/revoke: the token stops working at once; the row stays, marked revoked. */
export function useRevokeToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) =>
      api(`/tokens/${id}/revoke`, { method: "POST", schema: ResponseSchema }).then((r) => r.token),
    onSuccess: () => void qc.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}
