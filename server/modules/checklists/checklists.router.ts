import { checklistDraftBodySchema, zoneTypeParamsSchema } from "@shared/schemas/checklists";

import { defineRoute } from "../../lib/routes";
import * as checklists from "./checklists.service";

export const checklistRoutes = [
  defineRoute({
    method: "get",
    path: "/checklists",
    summary: "The published checklist (and any draft) for each zone type",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json(await checklists.listChecklists(deps.db, auth.user.networkId));
    },
  }),
  defineRoute({
    method: "put",
    path: "/checklists/:zoneType/draft",
    summary: "Save the draft of a zone type's checklist",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: zoneTypeParamsSchema,
    body: checklistDraftBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      const draft = await checklists.saveDraft(
        deps.db,
        auth.user.networkId,
        params.zoneType,
        body,
        actor,
      );
      res.json({ draft });
    },
  }),
  defineRoute({
    method: "post",
    path: "/checklists/:zoneType/publish",
    summary: "Publish the draft as the next version",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: zoneTypeParamsSchema,
    async handle({ res, deps, auth, params, actor }) {
      const published = await checklists.publishDraft(
        deps.db,
        auth.user.networkId,
        params.zoneType,
        actor,
      );
      res.json({ published });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/checklists/:zoneType/draft",
    summary: "Discard the draft",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: zoneTypeParamsSchema,
    async handle({ res, deps, auth, params, actor }) {
      await checklists.discardDraft(deps.db, auth.user.networkId, params.zoneType, actor);
      res.status(204).end();
    },
  }),
];
