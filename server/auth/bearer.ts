/**
 * Token authentication without passport: `Authorization: Bearer tw_…` makes the request act as the
 * token's owner. A `read` token may only GET/HEAD (anything else is 403), a `verify` token may also post
 * verification runs; a bad or revoked token is 401,
 * never a silent fall-back to the session, so a script learns at once that its token is dead.
 */
import type { Request, RequestHandler } from "express";
import type { TokenScope } from "../../shared/schemas/tokens";
import type { Db } from "../db/client";
import { HttpError } from "../http/errors";
import { authenticateToken, tokenSessionUser } from "../services/tokens";

/** What a token-authenticated request carries besides req.user. */
export interface RequestToken {
  id: number;
  scope: TokenScope;
  prefix: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set when the request came with a valid bearer token (req.user is then its owner). */
      apiToken?: RequestToken;
    }
  }
}

const READ_METHODS = new Set(["GET", "HEAD"]);
// The one write a `verify` token may make: POST /api/releases/:id/verifications.
const VERIFY_POST = /^\/api\/releases\/\d+\/verifications\/?$/;

/** Whether a token of this scope may make this request (the owner's roles are checked by the route). */
export function scopeAllows(scope: TokenScope, method: string, path: string): boolean {
  if (READ_METHODS.has(method) || scope === "read-write") return true;
  return scope === "verify" && method === "POST" && VERIFY_POST.test(path);
}
const BEARER = /^Bearer\s+(\S+)\s*$/i;

/** Middleware: authenticate `Authorization: Bearer` tokens; requests without the header pass untouched. */
export function bearerAuth(db: Db): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get("authorization");
    if (header === undefined) return next();
    const m = BEARER.exec(header);
    if (!m) throw new HttpError("unauthenticated", "Use `Authorization: Bearer <token>`");
    const path = req.originalUrl.split("?")[0] ?? req.originalUrl;
    const identity = await authenticateToken(db, m[1] ?? "", {
      method: req.method,
      path,
      ip: req.ip ?? null,
    });
    if (!identity) throw new HttpError("unauthenticated", "This API token is unknown or has been revoked");
    if (!scopeAllows(identity.scope, req.method, path))
      throw new HttpError(
        "forbidden",
        identity.scope === "verify"
          ? "This API token has the verify scope: it can download and post verification runs, nothing else"
          : "This API token is read-only: it can download but not change anything",
      );
    // The token speaks for its owner on this request only; nothing is written into the session.
    req.user = tokenSessionUser(identity);
    req.apiToken = { id: identity.tokenId, scope: identity.scope, prefix: identity.prefix };
    next();
  };
}

/** Refuse token-authenticated requests (token management needs a person signed in with a password). */
export const requireSession: RequestHandler = (req: Request, _res, next) => {
  if (req.apiToken) throw new HttpError("forbidden", "API tokens cannot manage tokens: sign in instead");
  next();
};
