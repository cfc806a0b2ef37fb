import { signInBodySchema } from "@shared/schemas/auth";

import { defineRoute } from "../../lib/routes";
import { signOut } from "../identity/identity.service";
import { signIn } from "./auth.service";

export const authRoutes = [
  defineRoute({
    method: "post",
    path: "/auth/sign-in",
    summary: "Sign in with e-mail and password",
    access: { kind: "public" },
    body: signInBodySchema,
    async handle({ req, res, deps, body }) {
      const { me, setCookie } = await signIn(deps, body, req.ip ?? "unknown");
      res.append("Set-Cookie", setCookie).status(200).json(me);
    },
  }),
  defineRoute({
    method: "post",
    path: "/auth/sign-out",
    summary: "End the current session (and say where to end the provider's, if begun there)",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      const ended = await signOut(deps, auth);
      res.append("Set-Cookie", ended.setCookie);
      if (!ended.providerSession) res.status(204).end();
      else res.status(200).json({ providerSignOutUrl: ended.providerSignOutUrl });
    },
  }),
  defineRoute({
    method: "get",
    path: "/auth/me",
    summary: "Who is signed in, with their roles",
    access: { kind: "signed-in" },
    handle({ res, auth }) {
      const { user, grants } = auth;
      res.json({ user: { id: user.id, email: user.email, name: user.name }, roles: grants });
    },
  }),
];
