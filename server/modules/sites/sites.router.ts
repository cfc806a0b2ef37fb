import { createSiteBodySchema, siteParamsSchema, updateSiteBodySchema } from "@shared/schemas/site";

import { atSite, defineRoute } from "../../lib/routes";
import {
  createSite,
  listRetiredSites,
  listSitesFor,
  requireSite,
  updateSite,
} from "./sites.service";

export const siteRoutes = [
  defineRoute({
    method: "get",
    path: "/sites",
    summary: "The sites where the person holds a role",
    access: { kind: "signed-in" },
    async handle({ res, deps, auth }) {
      res.json({ sites: await listSitesFor(deps.db, auth.user.networkId, auth.grants) });
    },
  }),
  defineRoute({
    method: "post",
    path: "/sites",
    summary: "Add a site to the network",
    access: { kind: "network", permission: "create:site:network" },
    body: createSiteBodySchema,
    async handle({ res, deps, auth, body, actor }) {
      const site = await createSite(deps.db, auth.user.networkId, body, actor);
      res.status(201).json({ site });
    },
  }),
  defineRoute({
    method: "get",
    path: "/retired-sites",
    summary: "The network's retired sites, for a network-wide administrator to restore",
    access: { kind: "network", permission: "create:site:network" },
    async handle({ res, deps, auth }) {
      res.json({ sites: await listRetiredSites(deps.db, auth.user.networkId) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId",
    summary: "One site",
    access: atSite("read:site:site"),
    params: siteParamsSchema,
    async handle({ res, deps, auth, params }) {
      res.json({ site: await requireSite(deps.db, auth.user.networkId, params.siteId) });
    },
  }),
  defineRoute({
    method: "patch",
    path: "/sites/:siteId",
    summary: "Change a site's name, address, time zone or position",
    access: atSite("update:site:site"),
    params: siteParamsSchema,
    body: updateSiteBodySchema,
    async handle({ res, deps, auth, params, body, actor }) {
      const site = await updateSite(deps.db, auth.user.networkId, params.siteId, body, actor);
      res.json({ site });
    },
  }),
];
