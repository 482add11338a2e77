import { z } from "zod";

/** The four roles of DESIGN.md; a user may hold several. */
export const ROLES = ["admin", "author", "reviewer", "firmware"] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

export const UsernameSchema = z
  .string()
  .trim()
  .min(3, "at least 3 characters")
  .max(40, "at most 40 characters")
  .regex(/^[a-z0-9][a-z0-9._-]*$/, "lower-case letters, digits, dot, dash or underscore");

/** Minimum password rules, shared by the sign-in, account and admin forms. */
export const NewPasswordSchema = z
  .string()
  .min(10, "at least 10 characters")
  .max(200, "at most 200 characters");

export const SignInSchema = z.object({
  username: z.string().trim().min(1, "enter your user name"),
  password: z.string().min(1, "enter your password"),
});
export type SignInInput = z.infer<typeof SignInSchema>;

export const ChangePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "enter your current password"),
    newPassword: NewPasswordSchema,
  })
  .refine((v) => v.currentPassword !== v.newPassword, {
    path: ["newPassword"],
    message: "must differ from the current password",
  });
export type ChangePasswordInput = z.infer<typeof ChangePasswordSchema>;

/** What the API tells the client about the signed-in user. */
export const SessionUserSchema = z.object({
  id: z.number().int(),
  username: z.string(),
  displayName: z.string(),
  email: z.string(),
  roles: z.array(RoleSchema),
  mustChangePassword: z.boolean(),
});
export type SessionUser = z.infer<typeof SessionUserSchema>;
