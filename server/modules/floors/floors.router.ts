import {
  fixtureBodySchema,
  fixtureParamsSchema,
  floorBodySchema,
  floorParamsSchema,
  scaleBodySchema,
  siteFloorsParamsSchema,
  spaceBodySchema,
  spaceParamsSchema,
  suiteBodySchema,
  updateFixtureBodySchema,
  updateFloorBodySchema,
  updateSpaceBodySchema,
} from "@shared/schemas/floors";

import { retirementBodySchema } from "@shared/schemas/retirement";

import { readUpload } from "../../middleware/upload";
import { atSite, defineRoute, siteThrough } from "../../lib/routes";
import * as retirement from "./floors.retirement";
import * as floors from "./floors.service";

const floor = siteThrough("floorId", floors.siteOfFloor);
const space = siteThrough("spaceId", floors.siteOfSpace);
const fixture = siteThrough("fixtureId", floors.siteOfFixture);

export const floorRoutes = [
  defineRoute({
    method: "get",
    path: "/sites/:siteId/floors",
    summary: "The floors of a site",
    access: atSite("read:site:site"),
    params: siteFloorsParamsSchema,
    async handle({ res, deps, params }) {
      res.json({ floors: await floors.listFloors(deps.db, params.siteId) });
    },
  }),
  defineRoute({
    method: "post",
    path: "/sites/:siteId/floors",
    summary: "Add a floor to a site",
    access: atSite("update:site:site"),
    params: siteFloorsParamsSchema,
    body: floorBodySchema,
    async handle(ctx) {
      const created = await floors.createFloor(ctx.deps.db, ctx.params.siteId, ctx.body, ctx.actor);
      ctx.res.status(201).json({ floor: created });
    },
  }),
  defineRoute({
    method: "get",
    path: "/floors/:floorId",
    summary: "A floor with its suites, spaces and fixtures",
    access: floor("read:site:site"),
    params: floorParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await floors.floorDetail(deps.db, params.floorId));
    },
  }),
  defineRoute({
    method: "get",
    path: "/spaces/:spaceId/floor",
    summary:
      "The floor a space is on, with its suites, spaces and fixtures (for a QR code's start)",
    access: space("read:site:site"),
    params: spaceParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await floors.floorOfSpace(deps.db, params.spaceId));
    },
  }),
  defineRoute({
    method: "patch",
    path: "/floors/:floorId",
    summary: "Rename or renumber a floor",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: updateFloorBodySchema,
    async handle(ctx) {
      ctx.res.json({
        floor: await floors.updateFloor(ctx.deps.db, ctx.params.floorId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/floors/:floorId",
    summary: "Delete a floor whose spaces have no history (409 otherwise: retire it)",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    async handle(ctx) {
      await retirement.deleteFloor(ctx.deps.db, ctx.params.floorId, ctx.actor);
      ctx.res.status(204).end();
    },
  }),
  defineRoute({
    method: "post",
    path: "/floors/:floorId/retire",
    summary: "Retire a floor and its spaces",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.retireFloor(
          ctx.deps.db,
          ctx.params.floorId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/floors/:floorId/restore",
    summary: "Restore a floor and the spaces retired with it",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.restoreFloor(
          ctx.deps.db,
          ctx.params.floorId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "get",
    path: "/sites/:siteId/retired",
    summary: "The site's retired floors and spaces, for administrators to restore",
    access: atSite("update:site:site"),
    params: siteFloorsParamsSchema,
    async handle({ res, deps, params }) {
      res.json(await retirement.retiredPlaces(deps.db, params.siteId));
    },
  }),
  // A whole site is retired or restored by a network-wide administrator, who also creates sites.
  defineRoute({
    method: "post",
    path: "/sites/:siteId/retire",
    summary: "Retire a site with its floors and spaces",
    access: atSite("create:site:network"),
    params: siteFloorsParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.retireSite(
          ctx.deps.db,
          ctx.auth.user.networkId,
          ctx.params.siteId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/sites/:siteId/restore",
    summary: "Restore a site with the floors and spaces retired with it",
    access: atSite("create:site:network"),
    params: siteFloorsParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.restoreSite(
          ctx.deps.db,
          ctx.auth.user.networkId,
          ctx.params.siteId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "put",
    path: "/floors/:floorId/plan",
    summary: "Upload or replace the floor plan image (multipart field `plan`)",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    async handle(ctx) {
      const buffer = await readUpload(ctx.req, ctx.res, "plan");
      ctx.res.json({
        floor: await floors.uploadPlan(ctx.deps, ctx.params.floorId, buffer, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "put",
    path: "/floors/:floorId/scale",
    summary: "Set the floor's scale from two points and their real distance",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: scaleBodySchema,
    async handle(ctx) {
      ctx.res.json({
        floor: await floors.setScale(ctx.deps.db, ctx.params.floorId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/floors/:floorId/suites",
    summary: "Group spaces that belong together (room, anteroom, donning, doffing)",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: suiteBodySchema,
    async handle(ctx) {
      ctx.res.status(201).json({
        suite: await floors.createSuite(ctx.deps.db, ctx.params.floorId, ctx.body.name, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/floors/:floorId/spaces",
    summary: "Draw a space on the floor plan",
    access: floor("update:site:site"),
    params: floorParamsSchema,
    body: spaceBodySchema,
    async handle(ctx) {
      ctx.res.status(201).json({
        space: await floors.createSpace(ctx.deps.db, ctx.params.floorId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "patch",
    path: "/spaces/:spaceId",
    summary: "Change a space",
    access: space("update:site:site"),
    params: spaceParamsSchema,
    body: updateSpaceBodySchema,
    async handle(ctx) {
      ctx.res.json({
        space: await floors.updateSpace(ctx.deps.db, ctx.params.spaceId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/spaces/:spaceId",
    summary: "Delete a space with no history (409 when it has audits or actions: retire it)",
    access: space("update:site:site"),
    params: spaceParamsSchema,
    async handle(ctx) {
      await retirement.deleteSpace(ctx.deps.db, ctx.params.spaceId, ctx.actor);
      ctx.res.status(204).end();
    },
  }),
  defineRoute({
    method: "post",
    path: "/spaces/:spaceId/retire",
    summary: "Retire a space: off the map and new audits, history kept, unfinished actions done",
    access: space("update:site:site"),
    params: spaceParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.retireSpace(
          ctx.deps.db,
          ctx.params.spaceId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/spaces/:spaceId/restore",
    summary: "Restore a retired space and put back the actions its retirement made Done",
    access: space("update:site:site"),
    params: spaceParamsSchema,
    body: retirementBodySchema,
    async handle(ctx) {
      ctx.res.json({
        retirement: await retirement.restoreSpace(
          ctx.deps.db,
          ctx.params.spaceId,
          ctx.body,
          ctx.actor,
        ),
      });
    },
  }),
  defineRoute({
    method: "post",
    path: "/spaces/:spaceId/fixtures",
    summary: "Place a fixture inside a space",
    access: space("update:site:site"),
    params: spaceParamsSchema,
    body: fixtureBodySchema,
    async handle(ctx) {
      ctx.res.status(201).json({
        fixture: await floors.createFixture(ctx.deps.db, ctx.params.spaceId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "patch",
    path: "/fixtures/:fixtureId",
    summary: "Move or relabel a fixture",
    access: fixture("update:site:site"),
    params: fixtureParamsSchema,
    body: updateFixtureBodySchema,
    async handle(ctx) {
      ctx.res.json({
        fixture: await floors.updateFixture(ctx.deps.db, ctx.params.fixtureId, ctx.body, ctx.actor),
      });
    },
  }),
  defineRoute({
    method: "delete",
    path: "/fixtures/:fixtureId",
    summary: "Remove a fixture",
    access: fixture("update:site:site"),
    params: fixtureParamsSchema,
    async handle(ctx) {
      await floors.deleteFixture(ctx.deps.db, ctx.params.fixtureId, ctx.actor);
      ctx.res.status(204).end();
    },
  }),
];
