import {
  acknowledgeAlarmBodySchema,
  pressureAlarmParamsSchema,
} from "@shared/schemas/pressure-site";
import { spaceParamsSchema } from "@shared/schemas/floors";
import { siteParamsSchema } from "@shared/schemas/site";

import { atSite, defineRoute, siteThrough } from "../../lib/routes";
import * as pressureSite from "./site.service";

const viaAlarm = siteThrough("alarmId", pressureSite.siteOfAlarm);
const viaSpace = siteThrough("spaceId", pressureSite.siteOfSpace);

/** Live room pressure where people already look: home, the map, the due list, an audit. */
export const pressureSiteRoutes = [
  defineRoute({
    method: "get",
    path: "/sites/:siteId/pressure-now",
    summary: "Each monitored room of the site: its pressure state now and any open alarm",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await pressureSite.pressureNow(deps.db, params.siteId));
    },
  }),
  defineRoute({
    method: "post",
    path: "/pressure-alarms/:alarmId/acknowledge",
    summary: "Acknowledge a room-pressure alarm with a note",
    access: viaAlarm("acknowledge:pressure-alarm:site"),
    params: pressureAlarmParamsSchema,
    body: acknowledgeAlarmBodySchema,
    async handle({ res, deps, params, body, actor }) {
      const alarm = await pressureSite.acknowledgeAlarm(deps.db, params.alarmId, body, actor);
      res.json({ alarm });
    },
  }),
  defineRoute({
    method: "get",
    path: "/spaces/:spaceId/pressure-24h",
    summary: "A room's pressure over the last 24 hours, a point a minute",
    access: viaSpace("read:site:site"),
    params: spaceParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await pressureSite.pressure24h(deps.db, params.spaceId));
    },
  }),
];
