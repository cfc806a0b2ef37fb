import type { RequestHandler } from "express";

import type { AppDeps, SignedIn } from "../lib/routes";

/**
 * Loads the person and their grants (or null) into res.locals.auth, from the session check's one
 * query; never rejects a request by itself.
 */
export function loadSession(deps: AppDeps): RequestHandler {
  return async (req, res, next) => {
    const check = await deps.sessions.check(req.headers.cookie);
    if (check.setCookie) res.append("Set-Cookie", check.setCookie);
    if (check.user && check.sessionId) {
      const auth: SignedIn = {
        user: check.user,
        sessionId: check.sessionId,
        grants: check.grants,
      };
      res.locals.auth = auth;
    } else {
      res.locals.auth = null;
    }
    next();
  };
}
