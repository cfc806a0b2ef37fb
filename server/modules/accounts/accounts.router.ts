import {
  changePasswordBodySchema,
  linkTokenParamsSchema,
  passwordResetRequestSchema,
  setPasswordBodySchema,
  updateProfileBodySchema,
} from "@shared/schemas/people";

import { defineRoute } from "../../lib/routes";
import * as accounts from "./accounts.service";

export const accountRoutes = [
  defineRoute({
    method: "get",
    path: "/invitations/:token",
    summary: "Who an invitation link is for, while it can be used",
    access: { kind: "public" },
    params: linkTokenParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await accounts.describeInvitation(deps, params.token));
    },
  }),
  defineRoute({
    method: "post",
    path: "/invitations/:token/accept",
    summary: "Set a password through an invitation link and sign in",
    access: { kind: "public" },
    params: linkTokenParamsSchema,
    body: setPasswordBodySchema,
    async handle({ res, deps, params, body, requestId }) {
      const { me, setCookie } = await accounts.acceptInvitation(
        deps,
        params.token,
        body.password,
        requestId,
      );
      res.append("Set-Cookie", setCookie).json(me);
    },
  }),
  defineRoute({
    method: "post",
    path: "/auth/password-reset",
    summary: "Ask for a password reset link (same answer for any address)",
    access: { kind: "public" },
    body: passwordResetRequestSchema,
    async handle({ req, res, deps, body, requestId }) {
      await accounts.requestPasswordReset(deps, body.email, req.ip ?? "unknown", requestId);
      res.status(202).json({ message: accounts.passwordResetAnswer });
    },
  }),
  defineRoute({
    method: "get",
    path: "/auth/password-reset/:token",
    summary: "Whose password a reset link changes, while it can be used",
    access: { kind: "public" },
    params: linkTokenParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await accounts.describePasswordReset(deps, params.token));
    },
  }),
  defineRoute({
    method: "post",
    path: "/auth/password-reset/:token",
    summary: "Set a new password through a reset link and sign in",
    access: { kind: "public" },
    params: linkTokenParamsSchema,
    body: setPasswordBodySchema,
    async handle({ res, deps, params, body, requestId }) {
      const { me, setCookie } = await accounts.resetPassword(
        deps,
        params.token,
        body.password,
        requestId,
      );
      res.append("Set-Cookie", setCookie).json(me);
    },
  }),
  defineRoute({
    method: "patch",
    path: "/auth/me",
    summary: "Change one's own display name",
    access: { kind: "signed-in" },
    body: updateProfileBodySchema,
    async handle({ res, deps, auth, body, actor }) {
      res.json(await accounts.updateProfile(deps, auth, body, actor));
    },
  }),
  defineRoute({
    method: "post",
    path: "/auth/me/password",
    summary: "Change one's own password; other sessions end",
    access: { kind: "signed-in" },
    body: changePasswordBodySchema,
    async handle({ req, res, deps, auth, body, actor }) {
      const setCookie = await accounts.changePassword(deps, auth, body, req.ip ?? "unknown", actor);
      res.append("Set-Cookie", setCookie).status(204).end();
    },
  }),
];
