import { committeeQuerySchema } from "@shared/schemas/committee";

import { defineRoute, type AnySiteAccess } from "../../lib/routes";
import { pressureCsv } from "./pressure.csv";
import { pressureFigures } from "./pressure.service";

const anyReadableSite: AnySiteAccess = { kind: "any-site", permission: "read:site:site" };

export const committeePressureRoutes = [
  defineRoute({
    method: "get",
    path: "/committee/pressure",
    summary:
      "Room pressure per readable site and month: hours out of range per monitored room, excursions per 1,000 monitored hours with the exact Poisson 95% interval",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      res.json(await pressureFigures(deps.db, auth.user.networkId, auth.grants, query));
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/pressure/export",
    summary: "The room-pressure figures as CSV: per site and month, the site's row then its rooms",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      const figures = await pressureFigures(deps.db, auth.user.networkId, auth.grants, query);
      res
        .type("text/csv; charset=utf-8")
        .attachment(`room-pressure-${query.from}-to-${query.to}.csv`)
        .send(pressureCsv(figures));
    },
  }),
];
