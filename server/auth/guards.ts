import type { Request, RequestHandler } from "express";
import type { Role, SessionUser } from "../../shared/schemas/auth";
import { HttpError } from "../http/errors";

/** The signed-in user or a 401. */
export function currentUser(req: Request): SessionUser {
  if (!req.user) throw new HttpError("unauthenticated", "Please sign in");
  return req.user;
}

/** Refuse requests without a session (401). */
export const requireUser: RequestHandler = (req, _res, next) => {
  currentUser(req);
  next();
};

/** Refuse users who hold none of the given roles (401 without a session, 403 otherwise). */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const user = currentUser(req);
    if (!roles.some((r) => user.roles.includes(r))) {
      throw new HttpError("forbidden", `This needs the ${roles.join(" or ")} role`);
    }
    next();
  };
}

// What a user on a temporary password may still do (paths inside /api): change it, sign out, ask who they are.
const WHILE_PASSWORD_MUST_CHANGE = new Set([
  "POST /account/password",
  "POST /auth/sign-out",
  "POST /auth/sign-in",
  "GET /auth/me",
  "GET /health",
  "HEAD /health",
]);

/**
 * Until a user on a temporary password (set by an admin) has chosen their own, every other API route answers
 * 403 `password_change_required`, whether the request came with the session or with an API token.
 */
export const requirePasswordChanged: RequestHandler = (req, _res, next) => {
  if (req.user?.mustChangePassword && !WHILE_PASSWORD_MUST_CHANGE.has(`${req.method} ${req.path}`))
    throw new HttpError(
      "password_change_required",
      "You are signed in with a temporary password: change it (POST /api/account/password) before anything else",
    );
  next();
};
