import {
  deactivateBodySchema,
  emptyBodySchema,
  grantInputSchema,
  inviteBodySchema,
  personGrantParamsSchema,
  personParamsSchema,
} from "@shared/schemas/people";

import { defineRoute, type AnySiteAccess } from "../../lib/routes";
import * as people from "./people.service";

const administrators: AnySiteAccess = { kind: "any-site", permission: "manage:people:site" };

export const peopleRoutes = [
  defineRoute({
    method: "get",
    path: "/people",
    summary: "People the administrator manages, with roles and status",
    access: administrators,
    async handle({ res, deps, auth }) {
      res.json(await people.listPeople(deps, auth));
    },
  }),
  defineRoute({
    method: "post",
    path: "/people/invitations",
    summary: "Invite someone by e-mail with roles",
    access: administrators,
    body: inviteBodySchema,
    async handle({ res, deps, auth, body, actor }) {
      const person = await people.invite(deps, auth, body, actor);
      res.status(201).json({ person });
    },
  }),
  defineRoute({
    method: "get",
    path: "/people/:userId",
    summary: "One person the administrator manages",
    access: administrators,
    params: personParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json({ person: await people.requirePerson(deps, auth, params.userId) });
    },
  }),
  defineRoute({
    method: "post",
    path: "/people/:userId/grants",
    summary: "Give a person a role at a site (or network-wide)",
    access: administrators,
    params: personParamsSchema,
    body: grantInputSchema,
    async handle({ res, deps, auth, params, body, actor }) {
      const person = await people.giveRole(deps, auth, params.userId, body, actor);
      res.status(201).json({ person });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/people/:userId/grants/:grantId",
    summary: "Take a role away",
    access: administrators,
    params: personGrantParamsSchema,
    async handle({ res, deps, auth, params, actor }) {
      const person = await people.takeRole(deps, auth, params.userId, params.grantId, actor);
      res.json({ person });
    },
  }),
  defineRoute({
    method: "post",
    path: "/people/:userId/deactivate",
    summary: "Deactivate a person and sign them out everywhere",
    access: administrators,
    params: personParamsSchema,
    body: deactivateBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      const person = await people.deactivate(deps, auth, params.userId, body.reason, actor);
      res.json({ person });
    },
  }),
  defineRoute({
    method: "post",
    path: "/people/:userId/reactivate",
    summary: "Reactivate a deactivated person",
    access: administrators,
    params: personParamsSchema,
    body: emptyBodySchema,
    async handle({ res, deps, auth, params, actor }) {
      const person = await people.reactivate(deps, auth, params.userId, actor);
      res.json({ person });
    },
  }),
  defineRoute({
    method: "post",
    path: "/people/:userId/invitation",
    summary: "Send a new invitation link (the old one stops working)",
    access: administrators,
    params: personParamsSchema,
    body: emptyBodySchema,
    async handle({ res, deps, auth, params, actor }) {
      const person = await people.resendInvitation(deps, auth, params.userId, actor);
      res.json({ person });
    },
  }),
];
