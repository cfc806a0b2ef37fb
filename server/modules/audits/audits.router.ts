import {
  amendmentBodySchema,
  answerBodySchema,
  auditItemParamsSchema,
  auditParamsSchema,
  auditPhotoFieldsSchema,
  cadenceBodySchema,
  startAuditBodySchema,
} from "@shared/schemas/audits";
import { spaceParamsSchema } from "@shared/schemas/floors";
import { siteParamsSchema } from "@shared/schemas/site";

import { readUpload } from "../../middleware/upload";
import { parseInput } from "../../middleware/validate";
import { atSite, defineRoute, siteThrough } from "../../lib/routes";
import * as audits from "./audits.service";

const viaAudit = siteThrough("auditId", audits.siteOfAudit);
const viaSpace = siteThrough("spaceId", audits.siteOfSpace);

export const auditRoutes = [
  defineRoute({
    method: "put",
    path: "/audits/:auditId",
    summary: "Start (or resume) an audit of a space with an id made by the device",
    // An audit that exists belongs where it is; a new one belongs where its space is, so its
    // body is read here, and a malformed one is refused naming the field (the schema says
    // nothing about what exists).
    access: siteThrough("auditId", async (db, auditId, rawBody) => {
      const existing = await audits.siteOfAudit(db, auditId);
      if (existing) return existing;
      const body = parseInput(startAuditBodySchema, rawBody, "body");
      return audits.siteOfSpace(db, body.spaceId);
    })("conduct:audit:site"),
    params: auditParamsSchema,
    body: startAuditBodySchema,
    async handle({ res, deps, auth, actor, params, body }) {
      const { created, detail } = await audits.startAudit(deps, auth, params.auditId, body, actor);
      res.status(created ? 201 : 200).json(detail);
    },
  }),
  defineRoute({
    method: "get",
    path: "/audits/:auditId",
    summary: "An audit with its checklist, answers and photos",
    access: viaAudit("read:site:site"),
    params: auditParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json(await audits.auditDetailFor(deps.db, auth, params.auditId));
    },
  }),
  defineRoute({
    method: "put",
    path: "/audits/:auditId/answers/:itemId",
    summary: "Answer one checklist item (idempotent)",
    access: viaAudit("conduct:audit:site"),
    params: auditItemParamsSchema,
    body: answerBodySchema,
    async handle({ res, deps, auth, params, body }) {
      res.json({
        answer: await audits.saveAnswer(deps, auth, params.auditId, params.itemId, body),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/audits/:auditId/photos",
    summary: "Add a photo to an audit (multipart: photo, id, itemId)",
    access: viaAudit("conduct:audit:site"),
    params: auditParamsSchema,
    async handle({ req, res, deps, auth, params }) {
      const buffer = await readUpload(req, res, "photo");
      const fields = parseInput(auditPhotoFieldsSchema, { ...req.body }, "body");
      const { created, photo } = await audits.addPhoto(deps, auth, params.auditId, {
        id: fields.id,
        itemId: fields.itemId ?? null,
        buffer,
      });
      res.status(created ? 201 : 200).json({ photo });
    },
  }),
  defineRoute({
    method: "post",
    path: "/audits/:auditId/submit",
    summary: "Submit a complete audit; the verdict and score are decided here",
    access: viaAudit("conduct:audit:site"),
    params: auditParamsSchema,
    async handle({ res, deps, auth, actor, params }) {
      res.json(await audits.submitAudit(deps, auth, params.auditId, actor));
    },
  }),
  defineRoute({
    method: "post",
    path: "/audits/:auditId/amendments",
    summary: "Correct one answer of a submitted audit, with a reason (administrators)",
    access: viaAudit("update:site:site"),
    params: auditParamsSchema,
    body: amendmentBodySchema,
    async handle({ res, deps, actor, params, body }) {
      res.json(await audits.amendAudit(deps, params.auditId, body, actor));
    },
  }),
  defineRoute({
    method: "get",
    path: "/spaces/:spaceId/audits",
    summary: "The audits of a space, newest first",
    access: viaSpace("read:site:site"),
    params: spaceParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json({ audits: await audits.auditsOfSpace(deps.db, params.spaceId, auth.user.id) });
    },
  }),
  defineRoute({
    method: "patch",
    path: "/spaces/:spaceId/cadence",
    summary: "How often a space is audited",
    access: viaSpace("update:site:site"),
    params: spaceParamsSchema,
    body: cadenceBodySchema,
    async handle({ res, deps, actor, params, body, siteId }) {
      res.json(await audits.setCadence(deps.db, params.spaceId, body.cadenceDays, actor, siteId));
    },
  }),
  defineRoute({
    method: "get",
    path: "/my/due",
    summary: "What the person has due or overdue across the sites where they audit",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json({ entries: await audits.myDue(deps, auth) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId/schedule",
    summary: "What is due and overdue at a site",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    async handle({ res, deps, params }) {
      res.json({ entries: await audits.siteSchedule(deps.db, params.siteId) });
    },
  }),
];
