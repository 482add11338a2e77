import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { SessionUserSchema, type SignInInput } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";
import { authKeys } from "./keys";

const SignedInSchema = z.object({ user: SessionUserSchema });

/** POST /api/auth/sign-in; on success the session cache holds the new user and everything else is refetched. */
export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInInput) =>
      api("/auth/sign-in", { method: "POST", body: input, schema: SignedInSchema }),
    onSuccess: ({ user }) => {
      // Drop the previous user's data before anything renders with the new session.
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      qc.setQueryData(authKeys.me(), user);
    },
  });
}
