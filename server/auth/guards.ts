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
