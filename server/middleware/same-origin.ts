import type { RequestHandler } from "express";

import { AppError } from "../lib/app-error";

const safeMethods = new Set(["GET", "HEAD", "OPTIONS"]);

function originOf(value: string | undefined): string | null {
  if (!value) return null;
  try {
    return new URL(value).origin;
  } catch {
    return null;
  }
}

/**
 * State-changing requests must come from the app's own pages: the Origin (or, failing that, the
 * Referer) must be the configured public URL's origin or the origin the request was addressed to.
 * Together with SameSite=Lax cookies this stops cross-site request forgery.
 */
export function requireSameOrigin(
  publicUrl: URL,
  /** Routes no session authorises (a machine's upload with its own token): forgery gains nothing. */
  exemptPaths: readonly string[] = [],
): RequestHandler {
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    if (exemptPaths.includes(req.path)) return next();
    // A machine sending with a bearer token (a pressure upload): a browser cannot add this header
    // to a cross-site request without the server's consent (CORS), so no forgery can carry it.
    if (/^Bearer\s/i.test(req.get("authorization") ?? "")) return next();
    const origin = originOf(req.get("origin")) ?? originOf(req.get("referer"));
    const addressed = `${req.protocol}://${req.get("host") ?? ""}`;
    if (origin !== null && (origin === publicUrl.origin || origin === addressed)) return next();
    next(new AppError("bad_origin", 403, "This request did not come from a Lintel page."));
  };
}
