import { spaceParamsSchema } from "@shared/schemas/floors";
import {
  observationBodySchema,
  observationParamsSchema,
  observationSettingsBodySchema,
  sequenceDraftBodySchema,
  sequenceParamsSchema,
} from "@shared/schemas/observations";

import { defineRoute, siteThrough } from "../../lib/routes";
import { parseInput } from "../../middleware/validate";
import * as observations from "./observations.service";
import * as sequences from "./sequences.service";

const viaObservation = siteThrough("observationId", observations.siteOfObservation);
const viaSpace = siteThrough("spaceId", observations.siteOfSpace);

export const observationRoutes = [
  defineRoute({
    method: "get",
    path: "/sequences",
    summary: "The published putting-on and removal sequences (and any drafts)",
    // Whoever observes somewhere, and administrators: decided in the service.
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json(await sequences.listSequences(deps.db, auth));
    },
  }),
  defineRoute({
    method: "put",
    path: "/sequences/:key/draft",
    summary: "Save the draft of a sequence (a new key makes a new sequence)",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: sequenceParamsSchema,
    body: sequenceDraftBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      const sequence = await sequences.saveDraft(
        deps.db,
        auth.user.networkId,
        params.key,
        body,
        actor,
      );
      res.json({ sequence });
    },
  }),
  defineRoute({
    method: "post",
    path: "/sequences/:key/publish",
    summary: "Publish a sequence's draft as its next version",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: sequenceParamsSchema,
    async handle({ res, deps, auth, params, actor }) {
      const published = await sequences.publishDraft(
        deps.db,
        auth.user.networkId,
        params.key,
        actor,
      );
      res.json({ published });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/sequences/:key/draft",
    summary: "Discard a sequence's draft",
    access: { kind: "network", permission: "manage:checklists:network" },
    params: sequenceParamsSchema,
    async handle({ res, deps, auth, params, actor }) {
      await sequences.discardDraft(deps.db, auth.user.networkId, params.key, actor);
      res.status(204).end();
    },
  }),
  defineRoute({
    method: "put",
    path: "/observations/:observationId",
    summary: "Record a finished observation with an id made by the device (idempotent)",
    // A recorded observation belongs where it is; a new one where its space is, so its body is
    // read here, and a malformed one is refused naming the field.
    access: siteThrough("observationId", async (db, observationId, rawBody) => {
      const existing = await observations.siteOfObservation(db, observationId);
      if (existing) return existing;
      const body = parseInput(observationBodySchema, rawBody, "body");
      return observations.siteOfSpace(db, body.spaceId);
    })("conduct:audit:site"),
    params: observationParamsSchema,
    body: observationBodySchema,
    async handle({ res, deps, auth, actor, params, body }) {
      const { created, observation } = await observations.recordObservation(
        deps,
        auth,
        params.observationId,
        body,
        actor,
      );
      res.status(created ? 201 : 200).json({ observation });
    },
  }),
  defineRoute({
    method: "get",
    path: "/observations/:observationId",
    summary: "One observation (staff codes only for the site's auditors and administrators)",
    access: viaObservation("read:site:site"),
    params: observationParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json({
        observation: await observations.observationFor(deps.db, auth, params.observationId),
      });
    },
  }),
  defineRoute({
    method: "get",
    path: "/spaces/:spaceId/observations",
    summary: "The observations at a space, newest first",
    access: viaSpace("read:site:site"),
    params: spaceParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json({
        observations: await observations.observationsOfSpace(deps.db, auth, params.spaceId),
      });
    },
  }),
  defineRoute({
    method: "get",
    path: "/observation-settings",
    summary: "How long the network keeps observation detail",
    access: { kind: "network", permission: "manage:checklists:network" },
    async handle({ res, deps, auth }) {
      res.json(await observations.observationSettingsOf(deps.db, auth.user.networkId));
    },
  }),
  defineRoute({
    method: "put",
    path: "/observation-settings",
    summary: "Change how long the network keeps observation detail",
    access: { kind: "network", permission: "manage:checklists:network" },
    body: observationSettingsBodySchema,
    async handle({ res, deps, auth, body, actor }) {
      res.json(
        await observations.saveObservationSettings(deps.db, auth.user.networkId, body, actor),
      );
    },
  }),
];
