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

/** bcrypt reads at most 72 bytes of a password; anything after would be silently ignored, so it is refused. */
export const PASSWORD_MAX_BYTES = 72;

/**
 * Password rules, shared by the account and admin forms and the server: at least 12 characters, at most 72
 * bytes of UTF-8, and not one character repeated (at least 5 different ones). "Not the user name" needs the
 * user name: see `passwordProblem`.
 */
export const NewPasswordSchema = z
  .string()
  .min(12, "at least 12 characters")
  .refine((v) => new TextEncoder().encode(v).length <= PASSWORD_MAX_BYTES, {
    message: `at most ${PASSWORD_MAX_BYTES} bytes (UTF-8): longer passwords would be cut short`,
  })
  .refine((v) => new Set(v).size >= 5, { message: "use at least 5 different characters" });

/** What is wrong with a password for this user beyond NewPasswordSchema, or null. */
export function passwordProblem(password: string, username: string): string | null {
  const folded = (s: string) =>
    s
      .normalize("NFKC")
      .toLowerCase()
      .replace(/[\s._-]+/g, "");
  const p = folded(password);
  const u = folded(username);
  if (u.length > 0 && p === u) return "must not be your user name";
  return null;
}

export const SignInSchema = z.object({
  username: z.string().trim().min(1, "enter your user name"),
  password: z.string().min(1, "enter your password"),
});
export type SignInInput = z.infer<typeof SignInSchema>;

export const ChangePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "enter your current password"),
    newPassword: NewPasswordSchema,
    /** Also revoke every API token of the account (other sessions always end). */
    revokeTokens: z.boolean().optional(),
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
