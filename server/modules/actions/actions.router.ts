import { stringify } from "csv-stringify/sync";

import { formatInZone } from "@shared/calc/due";
import { severityLabels } from "@shared/calc/verdict";
import {
  actionListQuerySchema,
  actionNoteBodySchema,
  actionParamsSchema,
  actionReasonBodySchema,
  actionStateLabels,
  assigneeBodySchema,
  duePolicySchema,
  proofFieldsSchema,
} from "@shared/schemas/actions";
import { siteParamsSchema } from "@shared/schemas/site";
import { actionMoves, type ActionMoveName } from "@shared/workflow/action-workflow";
import { zoneTypeLabels } from "@shared/zones";

import { asCell, cautionRow, csvPreamble } from "../../lib/csv";
import { readUpload } from "../../middleware/upload";
import { atSite, defineRoute, siteThrough } from "../../lib/routes";
import { parseInput } from "../../middleware/validate";
import * as actions from "./actions.service";

const viaAction = siteThrough("actionId", actions.siteOfAction);

/** Where a person's move is made, and who may make it, from the workflow table. */
const moveRoute = (name: ActionMoveName) => ({
  path: `/actions/:actionId/${actionMoves[name].path}`,
  access: viaAction(actionMoves[name].permission),
  params: actionParamsSchema,
});

const actionExportColumns = [
  "id",
  "site",
  "floor",
  "space",
  "zone type",
  "item",
  "severity",
  "state",
  "owner",
  "opened (UTC)",
  "due (UTC)",
  "due (site time)",
  "overdue",
  "done (UTC)",
  "days to close",
  "findings",
  "link",
];

export const actionRoutes = [
  defineRoute({
    method: "get",
    path: "/sites/:siteId/actions",
    summary:
      "A site's corrective actions, unfinished and overdue first (filters: state, floor, space, severity, overdue)",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    query: actionListQuerySchema,
    async handle({ res, deps, params, query }) {
      res.json({ actions: await actions.listActions(deps.db, params.siteId, query) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId/actions/export",
    summary: "The same list as CSV, one row per action",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    query: actionListQuerySchema,
    async handle({ res, deps, params, query }) {
      const rows = await actions.listActions(deps.db, params.siteId, query);
      const csv = stringify(
        rows.map((row) =>
          [
            row.id,
            row.siteName,
            row.floorName,
            row.spaceName,
            zoneTypeLabels[row.zoneType],
            row.title,
            severityLabels[row.severity],
            actionStateLabels[row.state],
            row.assignee?.name ?? "",
            row.openedAt,
            row.dueAt,
            formatInZone(new Date(row.dueAt), row.siteTimeZone),
            row.overdue ? "yes" : "no",
            row.closedAt ?? "",
            row.daysToClose ?? "",
            row.findingCount,
            actions.actionLink(deps.env, row.id),
          ].map(asCell),
        ),
        {
          header: true,
          columns: actionExportColumns,
        },
      );
      const day = new Date().toISOString().slice(0, 10);
      res
        .status(200)
        .type("text/csv; charset=utf-8")
        .attachment(`corrective-actions-${day}.csv`)
        .send(`${csvPreamble}${csv}${cautionRow(actionExportColumns.length)}`);
    },
  }),
  defineRoute({
    method: "get",
    path: "/my/actions",
    summary: "The unfinished actions the person owns, overdue first",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json({ actions: await actions.myActions(deps.db, auth) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/my/checks",
    summary: "Fixes to check at the sites where the person confirms fixes",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json({ actions: await actions.myChecks(deps.db, auth) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/actions/:actionId",
    summary: "A corrective action with its findings, photos, proof, plan position and timeline",
    access: viaAction("read:site:site"),
    params: actionParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await actions.actionDetail(deps.db, params.actionId));
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("start"),
    summary: "Start fixing: To fix → Being fixed (facilities lead)",
    async handle({ res, deps, auth, params, actor }) {
      res.json(await actions.startAction({ deps, auth, actor, actionId: params.actionId }));
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("add_photo"),
    summary: "Add a photo of the fix with an id made by the device (multipart: photo, id)",
    async handle({ req, res, deps, auth, params, actor }) {
      const buffer = await readUpload(req, res, "photo");
      const fields = parseInput(proofFieldsSchema, { ...req.body }, "body");
      const { created, detail } = await actions.addProof(
        { deps, auth, actor, actionId: params.actionId },
        { id: fields.id, buffer },
      );
      res.status(created ? 201 : 200).json(detail);
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("ask_check"),
    summary:
      "Ask for a check: Being fixed → Fix to check, with a note (needs a photo of this attempt)",
    body: actionNoteBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      res.json(
        await actions.askForCheck({ deps, auth, actor, actionId: params.actionId }, body.note),
      );
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("confirm"),
    summary: "Confirm the fix: Fix to check → Done, with a note (auditor)",
    body: actionNoteBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      res.json(
        await actions.confirmFix({ deps, auth, actor, actionId: params.actionId }, body.note),
      );
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("send_back"),
    summary:
      "Send back: Fix to check → Being fixed, with a reason; a new photo is needed (auditor)",
    body: actionReasonBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      res.json(
        await actions.sendBack({ deps, auth, actor, actionId: params.actionId }, body.reason),
      );
    },
  }),
  defineRoute({
    method: "post",
    ...moveRoute("reopen"),
    summary:
      "Reopen: Done → Being fixed, with a reason; it keeps its history and due time (auditor)",
    body: actionReasonBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      res.json(
        await actions.reopenAction({ deps, auth, actor, actionId: params.actionId }, body.reason),
      );
    },
  }),
  defineRoute({
    method: "put",
    ...moveRoute("assign"),
    summary: "Change owner: hand the action to another facilities lead of the site",
    body: assigneeBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      res.json(
        await actions.assignAction(
          { deps, auth, actor, actionId: params.actionId },
          body.assigneeId,
        ),
      );
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId/action-assignees",
    summary: "Who may own the site's actions (its active facilities leads)",
    access: atSite("assign:action:site"),
    params: siteParamsSchema,
    async handle({ res, deps, params }) {
      res.json({ people: await actions.assigneeOptions(deps.db, params.siteId) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId/due-policy",
    summary: "The site's due times by severity",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await actions.sitePolicy(deps.db, params.siteId));
    },
  }),
  defineRoute({
    method: "put",
    path: "/sites/:siteId/due-policy",
    summary: "Change the site's due times by severity (new actions only)",
    access: atSite("update:site:site"),
    params: siteParamsSchema,
    body: duePolicySchema,
    async handle({ res, deps, params, body, actor }) {
      res.json(await actions.setSitePolicy(deps.db, params.siteId, body, actor));
    },
  }),
];
