import { pressureSettingsBodySchema } from "@shared/schemas/pressure-alarms";
import { siteParamsSchema } from "@shared/schemas/site";

import { atSite, defineRoute } from "../../lib/routes";
import * as settings from "./settings.service";

export const pressureSettingsRoutes = [
  defineRoute({
    method: "get",
    path: "/sites/:siteId/pressure-settings",
    summary: "The site's room-pressure alarm graces, action limit and recipients",
    access: atSite("update:site:site"),
    params: siteParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await settings.pressureSettings(deps.db, params.siteId));
    },
  }),
  defineRoute({
    method: "put",
    path: "/sites/:siteId/pressure-settings",
    summary: "Change the site's room-pressure alarm graces, action limit and recipients",
    access: atSite("update:site:site"),
    params: siteParamsSchema,
    body: pressureSettingsBodySchema,
    async handle({ res, deps, params, body, actor }) {
      res.json(await settings.setPressureSettings(deps.db, params.siteId, body, actor));
    },
  }),
];
