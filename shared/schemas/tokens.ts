/** API token contracts (issue 7): created once and shown once, hashed at rest, read-only by default, revocable. */
import { z } from "zod";

export const TOKEN_SCOPES = ["read", "read-write", "verify"] as const;
/**
 * `read`: GET/HEAD only (downloads); `verify`: read, plus posting verification runs
 * (POST /api/releases/:id/verifications); `read-write`: also changes, as its owner's roles allow.
 */
export const TokenScopeSchema = z.enum(TOKEN_SCOPES);
export type TokenScope = z.infer<typeof TokenScopeSchema>;

/** Every secret starts with this, so leaked tokens are easy to find in logs and scanners. */
export const TOKEN_PREFIX = "tw_";

/** POST /api/tokens */
export const CreateTokenSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, "name the token (e.g. the build job using it)")
    .max(80, "at most 80 characters"),
  scope: TokenScopeSchema.default("read"),
});
export type CreateTokenInput = z.input<typeof CreateTokenSchema>;

/** A token as lists show it: never the secret, only its first characters. */
export const ApiTokenSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  /** The first 8 characters of the secret (e.g. "tw_3Fq9a"), to recognise it. */
  prefix: z.string(),
  scope: TokenScopeSchema,
  owner: z.object({ id: z.number().int(), username: z.string(), displayName: z.string() }),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiToken = z.infer<typeof ApiTokenSchema>;

/** GET /api/tokens (mine; admins add ?all=1 for everyone's). */
export const TokenListSchema = z.object({ tokens: z.array(ApiTokenSchema) });

/** POST /api/tokens answers 201 with the secret, the only time it is ever shown. */
export const CreatedTokenSchema = z.object({ token: ApiTokenSchema, secret: z.string() });
export type CreatedToken = z.infer<typeof CreatedTokenSchema>;
