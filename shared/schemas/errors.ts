import { z } from "zod";

/** The one JSON error shape every API route answers with. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>;

/** Error codes the server uses; the client may branch on them. */
export const ERROR_CODES = [
  "bad_request",
  "validation_failed",
  "unauthenticated",
  "forbidden",
  "not_found",
  "conflict",
  "rate_limited",
  "internal",
  /** A stored release bundle no longer matches its SHA-256: refused, never served. */
  "bundle_corrupt",
  /** A state-changing request from another origin (CSRF guard): 403. */
  "cross_site",
  /** Signed in on a temporary password: only the password change (and sign-out, who-am-I) until done. */
  "password_change_required",
  /** The database cannot be reached (503): nothing was changed; try again shortly. */
  "service_unavailable",
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];
