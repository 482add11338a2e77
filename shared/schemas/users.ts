import { z } from "zod";
import { NewPasswordSchema, RoleSchema, UsernameSchema } from "./auth";

export const UserSchema = z.object({
  id: z.number().int(),
  username: z.string(),
  displayName: z.string(),
  email: z.string(),
  roles: z.array(RoleSchema),
  active: z.boolean(),
  mustChangePassword: z.boolean(),
  createdAt: z.string(),
  lastSignInAt: z.string().nullable(),
});
export type User = z.infer<typeof UserSchema>;

export const CreateUserSchema = z.object({
  username: UsernameSchema,
  displayName: z.string().trim().min(1, "enter a name").max(120, "at most 120 characters"),
  email: z.email("enter an e-mail address"),
  roles: z.array(RoleSchema).min(1, "choose at least one role"),
  /** Optional: the server generates one when absent, and returns it once. */
  temporaryPassword: NewPasswordSchema.optional(),
});
export type CreateUserInput = z.infer<typeof CreateUserSchema>;

export const CreatedUserSchema = z.object({ user: UserSchema, temporaryPassword: z.string() });

export const UpdateUserSchema = z
  .object({
    displayName: z.string().trim().min(1).max(120).optional(),
    roles: z.array(RoleSchema).min(1, "choose at least one role").optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: "nothing to change" });
export type UpdateUserInput = z.infer<typeof UpdateUserSchema>;
