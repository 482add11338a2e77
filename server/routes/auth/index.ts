import type { NextFunction, Request, Response } from "express";
import { Router } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { SignInSchema, type SessionUser } from "../../../shared/schemas/auth";
import { clearSignInFailures, lockedForSeconds, recordSignInFailure } from "../../auth/backoff";
import type { SignInFailure } from "../../auth/passport";
import { currentUser } from "../../auth/guards";
import { HttpError, parseInput } from "../../http/errors";
import { actorFrom, recordAudit } from "../../services/audit";
import { touchSignIn } from "../../services/users";
import type { RouteContext } from "../context";

const BAD_CREDENTIALS = "User name or password is incorrect";

/** Run passport's local strategy and resolve with the user, or throw the matching HttpError. */
function authenticate(
  ctx: RouteContext,
  req: Request,
  res: Response,
  next: NextFunction,
): Promise<SessionUser> {
  return new Promise((resolve, reject) => {
    const run = ctx.passport.authenticate(
      "local",
      { session: false },
      (err: unknown, user: SessionUser | false, info: SignInFailure | undefined) => {
        if (err) return reject(err);
        if (user) return resolve(user);
        if (info?.reason === "deactivated")
          return reject(new HttpError("forbidden", "This account is deactivated"));
        reject(new HttpError("unauthenticated", BAD_CREDENTIALS));
      },
    ) as (req: Request, res: Response, next: NextFunction) => void;
    run(req, res, next);
  });
}

function logIn(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
}

function destroySession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
}

/** Session routes: sign in, sign out, who am I. */
export function authRoutes(ctx: RouteContext): Router {
  const r = Router();
  const limiter = rateLimit({
    windowMs: 60_000,
    limit: ctx.signInLimitPerMinute,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // Per address and user name: one person's typos do not lock out a shared office address.
    keyGenerator: (req) => {
      const body = req.body as { username?: unknown } | undefined;
      const name = typeof body?.username === "string" ? body.username.trim().toLowerCase() : "";
      return `${ipKeyGenerator(req.ip ?? "")}|${name}`;
    },
    handler: (_req, _res, next) =>
      next(new HttpError("rate_limited", "Too many sign-in attempts; wait a minute and try again")),
  });
  // Per address over every user name: spraying one password over many accounts is limited too.
  const addressLimiter = rateLimit({
    windowMs: 60_000,
    limit: ctx.signInLimitPerAddressPerMinute,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ""),
    handler: (_req, _res, next) =>
      next(
        new HttpError(
          "rate_limited",
          "Too many sign-in attempts from this address; wait a minute and try again",
        ),
      ),
  });

  r.post("/sign-in", addressLimiter, limiter, async (req, res, next) => {
    const input = parseInput(SignInSchema, req.body);
    req.body = input;
    const wait = await lockedForSeconds(ctx.db, input.username);
    if (wait > 0) {
      res.setHeader("Retry-After", String(wait));
      throw new HttpError(
        "rate_limited",
        `Too many failed sign-ins for this user name; try again in ${wait} s`,
        { retryAfterSeconds: wait },
      );
    }
    let user: SessionUser;
    try {
      user = await authenticate(ctx, req, res, next);
    } catch (err) {
      if (err instanceof HttpError) {
        if (err.code === "unauthenticated") await recordSignInFailure(ctx.db, input.username);
        // Nothing changes on a refused sign-in, so the row stands alone (no transaction to join).
        await recordAudit(ctx.db, {
          actor: actorFrom(req),
          action: "auth.sign-in-failed",
          subjectType: "user",
          summary: `Sign-in refused for "${input.username}" (${err.code === "forbidden" ? "deactivated" : "wrong user name or password"})`,
          details: {
            username: input.username,
            reason: err.code === "forbidden" ? "deactivated" : "bad_credentials",
          },
        });
      }
      throw err;
    }
    await clearSignInFailures(ctx.db, input.username);
    await logIn(req, user);
    await ctx.db.transaction(async (tx) => {
      await touchSignIn(tx, user.id);
      await recordAudit(tx, {
        actor: { kind: "user", userId: user.id, ip: req.ip ?? null },
        action: "auth.sign-in",
        subjectType: "user",
        subjectId: user.id,
        summary: `${user.username} signed in`,
      });
    });
    res.status(200).json({ user });
  });

  r.post("/sign-out", async (req, res) => {
    if (req.user) {
      await recordAudit(ctx.db, {
        actor: actorFrom(req),
        action: "auth.sign-out",
        subjectType: "user",
        subjectId: req.user.id,
        summary: `${req.user.username} signed out`,
      });
      await logOut(req);
    }
    if (req.session) await destroySession(req);
    res.clearCookie("tapwright.sid", { path: "/", httpOnly: true, sameSite: "strict" });
    res.status(204).end();
  });

  r.get("/me", (req, res) => {
    res.json({ user: currentUser(req) });
  });
  return r;
}
