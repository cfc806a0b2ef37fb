import { spaceParamsSchema } from "@shared/schemas/floors";
import { monitorMappingBodySchema, pressureSpaceQuerySchema } from "@shared/schemas/pressure-space";

import { defineRoute, siteThrough } from "../../lib/routes";
import * as pressure from "./space.service";

const viaSpace = siteThrough("spaceId", pressure.siteOfSpace);

export const pressureSpaceRoutes = [
  defineRoute({
    method: "get",
    path: "/spaces/:spaceId/pressure",
    summary:
      "A room's pressure: its monitor, the live value, 24 hours or 30 days of readings and the alarms",
    access: viaSpace("read:site:site"),
    params: spaceParamsSchema,
    query: pressureSpaceQuerySchema,
    async handle({ res, deps, params, query }) {
      res.json(await pressure.pressureOfSpace(deps.db, params.spaceId, query.range, new Date()));
    },
  }),
  defineRoute({
    method: "put",
    path: "/spaces/:spaceId/monitor",
    summary: "Map a pressure monitor to an isolation room, or change its id or threshold",
    access: viaSpace("update:site:site"),
    params: spaceParamsSchema,
    body: monitorMappingBodySchema,
    async handle(ctx) {
      ctx.res.json({
        monitor: await pressure.mapMonitor(ctx.deps.db, ctx.params.spaceId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/spaces/:spaceId/monitor",
    summary: "Take the pressure monitor off a room (409 once it has alarms in the room's log)",
    access: viaSpace("update:site:site"),
    params: spaceParamsSchema,
    async handle(ctx) {
      await pressure.unmapMonitor(ctx.deps.db, ctx.params.spaceId, ctx.actor);
      ctx.res.status(204).end();
    },
  }),
];
