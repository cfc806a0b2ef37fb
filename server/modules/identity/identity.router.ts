import { z } from "zod";

import { emailSchema, text } from "@shared/schemas/common";
import {
  identityProviderBodySchema,
  signInMethodBodySchema,
} from "@shared/schemas/identity-provider";

import type { Request } from "express";

import { defineRoute } from "../../lib/routes";
import * as identity from "./identity.service";

const managed = { kind: "network", permission: "manage:identity-provider:network" } as const;

const startQuerySchema = z.object({
  email: emailSchema,
  next: text().max(500, { message: "At most 500 characters." }).optional(),
});

// Only what an authorization response carries; anything else the provider adds is left out.
const callbackText = () => text().max(4096, { message: "Too long." }).optional();
const callbackQuerySchema = z.object({
  code: callbackText(),
  state: callbackText(),
  iss: callbackText(),
  error: callbackText(),
  session_state: callbackText(),
});

function attemptKeyOf(req: Request): string | null {
  for (const part of (req.headers.cookie ?? "").split(";")) {
    const [name, ...rest] = part.trim().split("=");
    if (name === identity.attemptCookieName) {
      const value = rest.join("=");
      return /^[A-Za-z0-9_-]{43}$/.test(value) ? value : null;
    }
  }
  return null;
}

function attemptCookie(value: string, secure: boolean): string {
  return [
    `${identity.attemptCookieName}=${value}`,
    "Path=/api/auth/provider",
    `Max-Age=${identity.attemptMinutes * 60}`,
    "HttpOnly",
    "SameSite=Lax",
    ...(secure ? ["Secure"] : []),
  ].join("; ");
}

const problemLocation = (reason: string, requestId: string) =>
  `/sign-in/problem?${new URLSearchParams({ reason, request: requestId }).toString()}`;

export const identityRoutes = [
  defineRoute({
    method: "post",
    path: "/auth/sign-in/method",
    summary: "How an e-mail address signs in: its network's provider, a password, or both",
    access: { kind: "public" },
    body: signInMethodBodySchema,
    async handle({ res, deps, body }) {
      res.json(await identity.signInMethod(deps, body.email));
    },
  }),
  defineRoute({
    method: "get",
    path: "/auth/provider/start",
    summary: "Send the browser to the identity provider covering the address",
    access: { kind: "public" },
    query: startQuerySchema,
    async handle({ req, res, deps, query, requestId }) {
      try {
        const { location, browserKey } = await identity.startSignIn(deps, {
          email: query.email,
          next: query.next,
          browserKey: attemptKeyOf(req),
        });
        res.append(
          "Set-Cookie",
          attemptCookie(browserKey, deps.env.publicUrl.protocol === "https:"),
        );
        res.redirect(302, location);
      } catch (err) {
        if (!(err instanceof identity.ProviderProblem)) throw err;
        deps.logger.warn(
          { requestId, reason: err.reason, detail: err.detail },
          "provider sign-in could not start",
        );
        res.redirect(302, problemLocation(err.reason, requestId));
      }
    },
  }),
  defineRoute({
    method: "get",
    path: "/auth/provider/callback",
    summary: "Where the identity provider sends the browser back: sign in, or say why not",
    access: { kind: "public" },
    query: callbackQuerySchema,
    async handle({ req, res, deps, query, requestId }) {
      const known = Object.fromEntries(
        Object.entries(query).filter((entry): entry is [string, string] => entry[1] !== undefined),
      );
      try {
        const { setCookie, nextPath } = await identity.finishSignIn(deps, {
          query: known,
          browserKey: attemptKeyOf(req),
          requestId,
        });
        res.append("Set-Cookie", setCookie);
        res.redirect(302, nextPath);
      } catch (err) {
        const problem =
          err instanceof identity.ProviderProblem
            ? err
            : new identity.ProviderProblem(
                "unavailable",
                err instanceof Error ? err.name : "error",
              );
        deps.logger.warn(
          { requestId, reason: problem.reason, detail: problem.detail },
          "provider sign-in refused",
        );
        if (!(err instanceof identity.ProviderProblem))
          deps.logger.error({ requestId, err }, "provider sign-in failed unexpectedly");
        res.redirect(302, problemLocation(problem.reason, requestId));
      }
    },
  }),
  defineRoute({
    method: "get",
    path: "/admin/identity-provider",
    summary: "The network's identity provider settings (never the secret)",
    access: managed,
    async handle({ res, deps, auth }) {
      res.json(await identity.getSettings(deps, auth));
    },
  }),
  defineRoute({
    method: "put",
    path: "/admin/identity-provider",
    summary: "Set the network's identity provider, its domains and whether passwords stay allowed",
    access: managed,
    body: identityProviderBodySchema,
    async handle({ res, deps, auth, body, actor }) {
      res.json(await identity.saveSettings(deps, auth, body, actor));
    },
  }),
  defineRoute({
    method: "delete",
    path: "/admin/identity-provider",
    summary: "Remove the network's identity provider; password sign-in returns",
    access: managed,
    async handle({ res, deps, auth, actor }) {
      await identity.deleteSettings(deps, auth, actor);
      res.status(204).end();
    },
  }),
  defineRoute({
    method: "post",
    path: "/admin/identity-provider/test",
    summary: "Test the stored provider settings step by step",
    access: managed,
    async handle({ res, deps, auth }) {
      res.json(await identity.testConnection(deps, auth));
    },
  }),
];
