/**
 * Cross-site request forgery guard: every state-changing request (anything but GET, HEAD, OPTIONS) must come
 * from the app's own origin. Browsers say where a request comes from in `Sec-Fetch-Site` and `Origin`; a page
 * on another origin (another port of the same host included) cannot hide either. Scripts send neither, and
 * are let through when they carry no session cookie (nothing to forge) or a bearer token (a header a page on
 * another origin cannot set without a CORS grant, and this server grants none).
 */
import type { Request, RequestHandler } from "express";
import { HttpError } from "./errors";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** Why a request is refused, or null when it may go on. */
export function crossSiteRefusal(
  req: Pick<Request, "method" | "get" | "protocol" | "host">,
  options: { sessionCookie: string; allowedOrigins: readonly string[] },
): string | null {
  if (SAFE_METHODS.has(req.method)) return null;
  if (req.get("authorization") !== undefined) return null;
  const fetchSite = req.get("sec-fetch-site");
  const origin = req.get("origin");
  if (fetchSite !== undefined && fetchSite !== "same-origin")
    return `a ${fetchSite} request cannot change anything here (Sec-Fetch-Site: ${fetchSite})`;
  if (origin !== undefined) {
    const own = `${req.protocol}://${req.host}`;
    if (origin !== own && !options.allowedOrigins.includes(origin))
      return `a request from ${origin} cannot change anything here`;
    return null;
  }
  if (fetchSite === "same-origin") return null;
  // Neither header: a script. With the session cookie it would act as a signed-in person, so refuse.
  const cookies = req.get("cookie") ?? "";
  if (cookies.split(";").some((c) => c.trim().startsWith(`${options.sessionCookie}=`)))
    return "a request carrying the session cookie must say where it comes from (Origin or Sec-Fetch-Site)";
  return null;
}

/** Middleware: 403 `cross_site` for state-changing requests from another origin. */
export function sameOriginOnly(options: {
  sessionCookie: string;
  allowedOrigins: readonly string[];
}): RequestHandler {
  return (req, _res, next) => {
    const reason = crossSiteRefusal(req, options);
    if (reason) throw new HttpError("cross_site", `Refused: ${reason}`);
    next();
  };
}
