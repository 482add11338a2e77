import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import {
  CreatedUserSchema,
  UserSchema,
  type CreateUserInput,
  type UpdateUserInput,
} from "@shared/schemas/users";
import { api } from "@/lib/api-client";

/** Query keys for users (admin). */
export const userKeys = {
  all: ["users"] as const,
  list: () => [...userKeys.all, "list"] as const,
};

const UsersSchema = z.object({ users: z.array(UserSchema) });
const UserEnvelopeSchema = z.object({ user: UserSchema });

/** GET /api/admin/users. */
export const usersQueryOptions = () =>
  queryOptions({
    queryKey: userKeys.list(),
    queryFn: ({ signal }) => api("/admin/users", { schema: UsersSchema, signal }).then((r) => r.users),
  });

/** Every user (admin only). */
export function useUsers() {
  return useQuery(usersQueryOptions());
}

/** POST /api/admin/users: answers the user and their one-time temporary password. */
export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateUserInput) =>
      api("/admin/users", { method: "POST", body: input, schema: CreatedUserSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }),
  });
}

/** PATCH /api/admin/users/:id: roles, name or active state. */
export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: number; patch: UpdateUserInput }) =>
      api(`/admin/users/${id}`, { method: "PATCH", body: patch, schema: UserEnvelopeSchema }).then(
        (r) => r.user,
      ),
    // Home counts users and sessions, so it goes stale too.
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: userKeys.all }),
        qc.invalidateQueries({ queryKey: ["home"] }),
      ]),
  });
}
