import type { z } from "zod";

import { proofFieldsSchema } from "@shared/schemas/actions";
import { auditPhotoFieldsSchema } from "@shared/schemas/audits";

import { insertSpace } from "../factories/audits";
import { buildObservation, publishedSequence } from "../factories/observations";
import { insertAlarmH4, insertMonitorH4 } from "../factories/pressure-h4";
import { freshMonitorId, insertMonitoredRoom } from "../factories/pressure-h3";
import { insertUploadToken, newMonitorId } from "../factories/pressure-h1";
import { buildSite } from "../factories/records";
import { api } from "../helpers/app";
import { uniqueDomain } from "../helpers/identity-provider";
import { newId, worldPassword, type CallerName, type World } from "../helpers/robustness-world";

/**
 * One valid request per route, keyed "METHOD /path" as in server/routes.ts. The robustness walk
 * (robustness.test.ts) sends each write route's example last, after a battery of malformed
 * variants generated from it, and expects a 2xx — so the example must be a request the handler
 * accepts as is. `control` may make fresh rows of its own through `world.fresh`, since a control
 * may use one up (a deleted space, a submitted audit, a verified action).
 *
 * Adding a write route means adding its example here; the walk fails naming any write route
 * without one. Read routes may have one too (for a query or a particular resource); without one
 * their params are filled from `readParams` by name.
 */
export interface RouteExample {
  /** Who calls; by default the first caller the route's access admits (see `callerNames`). */
  as?: CallerName | "nobody";
  control: (world: World) => Promise<ExampleRequest> | ExampleRequest;
  /**
   * Where an id is made by the device (`params.auditId`, `body.id`, `fields.id`): any fresh id is
   * valid there, so the walk does not expect an unknown id to be refused.
   */
  newIds?: string[];
  /**
   * A read route the browser navigates to, answering with a redirect: every request, however
   * malformed, must get a 4xx or a 302 to `/sign-in/problem` (and no session), never a 2xx or 5xx.
   */
  redirectsToProblem?: boolean;
}

export interface ExampleRequest {
  params?: Record<string, string>;
  query?: Record<string, string>;
  /** A JSON body. */
  body?: unknown;
  /** A multipart upload instead of a JSON body. */
  upload?: { field: string; file: Buffer; name: string; fields?: Record<string, string> };
  /** The schema of the upload's text fields, which tells a missing optional field from a fault. */
  uploadSchema?: z.ZodType;
  /** Extra headers on every request of the battery (a pressure upload's bearer token). */
  headers?: Record<string, string>;
}

const square: [number, number][] = [
  [10, 10],
  [120, 10],
  [120, 120],
  [10, 120],
];

async function freshSequenceDraft(w: World, key: string) {
  const reply = await api(w.app.app, { cookie: await w.fresh.cookie("administrator (network)") })
    .put(`/api/sequences/${key}/draft`)
    .send({
      title: "Our sequence",
      kind: "removal",
      steps: [{ text: "Gloves off", handHygiene: false, watchFor: [] }],
    });
  if (reply.status !== 200) throw new Error(`sequence draft: ${reply.status}`);
}

async function freshObservation(w: World): Promise<string> {
  const id = newId();
  const sequence = await publishedSequence(w.app.deps.db, w.networkId);
  const reply = await api(w.app.app, { cookie: await w.fresh.cookie("auditor @A") })
    .put(`/api/observations/${id}`)
    .send(buildObservation((await w.fresh.space()).id, sequence));
  if (reply.status !== 201) throw new Error(`observation: ${reply.status}`);
  return id;
}

/** Settings any network may store: nothing listens at that issuer, and the domain is fresh. */
const providerSettings = () => ({
  name: "Ward Health",
  issuerUrl: "http://127.0.0.1:9",
  clientId: "ward-client",
  clientSecret: "ward-secret",
  domains: [uniqueDomain()],
  passwordAllowed: true,
  assumeVerifiedEmail: false,
});

export const examples: Record<string, RouteExample> = {
  // Accounts and sign-in
  "POST /auth/sign-in": {
    as: "nobody",
    control: async (w) => ({
      body: { email: (await w.fresh.person()).email, password: worldPassword },
    }),
  },
  "POST /auth/sign-out": { as: "auditor @A", control: () => ({}) },
  "POST /invitations/:token/accept": {
    as: "nobody",
    async control(w) {
      const person = await w.fresh.person("invited");
      return {
        params: { token: await w.fresh.link(person.id, "invitation") },
        body: { password: "joining the ward team today" },
      };
    },
  },
  "POST /auth/password-reset": {
    as: "nobody",
    control: async (w) => ({ body: { email: (await w.fresh.person()).email } }),
  },
  "POST /auth/password-reset/:token": {
    as: "nobody",
    async control(w) {
      const person = await w.fresh.person();
      return {
        params: { token: await w.fresh.link(person.id, "password_reset") },
        body: { password: "a fresh passphrase after reset" },
      };
    },
  },
  // Single sign-on: the e-mail-first question, the redirects, and the administrator's settings.
  "POST /auth/sign-in/method": {
    as: "nobody",
    control: async (w) => ({ body: { email: (await w.fresh.person()).email } }),
  },
  "GET /auth/provider/start": {
    as: "nobody",
    redirectsToProblem: true,
    control: () => ({ query: { email: "someone@example.org", next: "/committee" } }),
  },
  "GET /auth/provider/callback": {
    as: "nobody",
    redirectsToProblem: true,
    control: () => ({ query: { state: "not-a-sign-in", code: "not-a-code" } }),
  },
  "PUT /admin/identity-provider": {
    control: () => ({ body: providerSettings() }),
  },
  "DELETE /admin/identity-provider": { control: () => ({}) },
  "POST /admin/identity-provider/test": {
    async control(w) {
      const reply = await api(w.app.app, {
        cookie: await w.fresh.cookie("administrator (network)"),
      })
        .put("/api/admin/identity-provider")
        .send(providerSettings());
      if (reply.status !== 200) throw new Error(`provider settings: ${reply.status}`);
      return {};
    },
  },
  "PATCH /auth/me": { control: () => ({ body: { name: "Imogen Hale" } }) },
  "POST /auth/me/password": {
    control: () => ({
      body: { currentPassword: worldPassword, newPassword: "a new long passphrase for the ward" },
    }),
  },

  // Sites and people
  "POST /sites": { control: () => ({ body: buildSite() }) },
  "PATCH /sites/:siteId": {
    control: (w) => ({ params: { siteId: w.siteA }, body: { address: "4 Infirmary Lane" } }),
  },
  "PUT /sites/:siteId/due-policy": {
    control: (w) => ({
      params: { siteId: w.siteA },
      body: {
        critical: { amount: 12, unit: "hours" },
        major: { amount: 5, unit: "days" },
        minor: { amount: 21, unit: "days" },
      },
    }),
  },
  "PUT /sites/:siteId/pressure-settings": {
    control: (w) => ({
      params: { siteId: w.siteA },
      body: {
        graceSeconds: 90,
        doorGraceSeconds: 300,
        actionLimitMinutes: 20,
        recipients: [w.callers["facilities lead @A"].id],
      },
    }),
  },
  "POST /mail/:mailId/resend": {
    as: "administrator (network)",
    control: async (w) => ({ params: { mailId: await w.fresh.uncertainMail() }, body: {} }),
  },
  "POST /people/invitations": {
    control: (w) => ({
      body: {
        email: `invitee-${newId()}@example.org`,
        name: "Nadia Okafor",
        grants: [{ role: "auditor", siteId: w.siteA }],
      },
    }),
  },
  "POST /people/:userId/grants": {
    control: async (w) => ({
      params: { userId: (await w.fresh.person()).id },
      body: { role: "facilities_lead", siteId: w.siteA },
    }),
  },
  "DELETE /people/:userId/grants/:grantId": {
    async control(w) {
      const person = await w.fresh.person();
      return { params: { userId: person.id, grantId: person.grantId } };
    },
  },
  "POST /people/:userId/deactivate": {
    control: async (w) => ({
      params: { userId: (await w.fresh.person()).id },
      body: { reason: "Left the trust" },
    }),
  },
  "POST /people/:userId/reactivate": {
    control: async (w) => ({
      params: { userId: (await w.fresh.person("deactivated")).id },
      body: {},
    }),
  },
  "POST /people/:userId/invitation": {
    control: async (w) => ({ params: { userId: (await w.fresh.person("invited")).id }, body: {} }),
  },

  // Floors, spaces, fixtures, images
  "POST /sites/:siteId/floors": {
    control: (w) => ({
      params: { siteId: w.siteA },
      body: { building: "East block", level: 2, name: "Level 2" },
    }),
  },
  "PATCH /floors/:floorId": {
    control: (w) => ({ params: { floorId: w.floorA }, body: { name: "Level 1 (east)" } }),
  },
  "PUT /floors/:floorId/plan": {
    control: (w) => ({
      params: { floorId: w.floorA },
      upload: { field: "plan", file: w.planPng, name: "plan.png" },
    }),
  },
  "PUT /floors/:floorId/scale": {
    control: (w) => ({
      params: { floorId: w.floorA },
      body: { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: 2 },
    }),
  },
  "POST /floors/:floorId/suites": {
    control: (w) => ({ params: { floorId: w.floorA }, body: { name: "Suite 4" } }),
  },
  "POST /floors/:floorId/spaces": {
    control: (w) => ({
      params: { floorId: w.floorA },
      body: { zoneType: "donning_zone", name: "Donning 4", polygon: square },
    }),
  },
  "PATCH /spaces/:spaceId": {
    control: async (w) => ({
      params: { spaceId: (await w.fresh.space()).id },
      body: { name: "Doffing 2" },
    }),
  },
  "DELETE /spaces/:spaceId": {
    control: async (w) => ({ params: { spaceId: (await w.fresh.space()).id } }),
  },
  "POST /spaces/:spaceId/retire": {
    control: async (w) => ({
      params: { spaceId: (await w.fresh.space()).id },
      body: { reason: "Ward converted to offices" },
    }),
  },
  "POST /spaces/:spaceId/restore": {
    async control(w) {
      const space = await w.fresh.space();
      await w.fresh.retire("spaces", space.id);
      return { params: { spaceId: space.id }, body: { reason: "Ward reopened" } };
    },
  },
  "DELETE /floors/:floorId": {
    control: async (w) => ({ params: { floorId: (await w.fresh.floor()).id } }),
  },
  "POST /floors/:floorId/retire": {
    control: async (w) => ({ params: { floorId: (await w.fresh.floor()).id }, body: {} }),
  },
  "POST /floors/:floorId/restore": {
    async control(w) {
      const floor = await w.fresh.floor();
      await w.fresh.retire("floors", floor.id);
      return { params: { floorId: floor.id }, body: {} };
    },
  },
  "POST /sites/:siteId/retire": {
    as: "administrator (network)",
    control: async (w) => ({ params: { siteId: (await w.fresh.site()).id }, body: {} }),
  },
  "POST /sites/:siteId/restore": {
    as: "administrator (network)",
    async control(w) {
      const site = await w.fresh.site();
      await w.fresh.retire("sites", site.id);
      return { params: { siteId: site.id }, body: {} };
    },
  },
  "PUT /spaces/:spaceId/monitor": {
    async control(w) {
      const room = await insertSpace(
        w.app.deps.db,
        { id: w.floorA, siteId: w.siteA },
        "isolation_room",
      );
      return {
        params: { spaceId: room.id },
        body: { monitorId: freshMonitorId(), thresholdPa: -4 },
      };
    },
  },
  "DELETE /spaces/:spaceId/monitor": {
    control: async (w) => ({
      params: { spaceId: (await insertMonitoredRoom(w.app.deps.db, w.siteA)).space.id },
    }),
  },
  "PATCH /spaces/:spaceId/cadence": {
    control: (w) => ({ params: { spaceId: w.spaceA }, body: { cadenceDays: 14 } }),
  },
  "POST /spaces/:spaceId/fixtures": {
    control: (w) => ({
      params: { spaceId: w.spaceA },
      body: { kind: "hand_rub_station", x: 110, y: 110 },
    }),
  },
  "PATCH /fixtures/:fixtureId": {
    control: async (w) => ({
      params: { fixtureId: (await w.fresh.fixture()).id },
      body: { x: 160 },
    }),
  },
  "DELETE /fixtures/:fixtureId": {
    control: async (w) => ({ params: { fixtureId: (await w.fresh.fixture()).id } }),
  },
  "POST /sites/:siteId/images": {
    control: async (w) => ({
      params: { siteId: w.siteA },
      upload: { field: "photo", file: await w.fresh.jpeg(), name: "chair.jpg" },
    }),
  },

  // Checklists
  "PUT /checklists/:zoneType/draft": {
    control: () => ({
      params: { zoneType: "anteroom" },
      body: {
        title: "Anteroom checks",
        items: [
          { text: "Doors close by themselves", severity: "major", response: "check" },
          {
            key: "pressure",
            text: "Pressure towards the room",
            severity: "critical",
            response: "reading",
            quantity: "pressure",
            threshold: { op: ">=", value: 2.5 },
            reference: "FGI 2022 table 7.1",
            photoOnFail: true,
          },
          {
            text: "Gown stock",
            severity: "minor",
            response: "choice",
            choices: [
              { value: "full", label: "Full", passes: true },
              { value: "low", label: "Low", passes: false },
            ],
          },
        ],
      },
    }),
  },
  "POST /checklists/:zoneType/publish": {
    async control(w) {
      await w.fresh.checklistDraft("donning_zone");
      return { params: { zoneType: "donning_zone" } };
    },
  },
  "DELETE /checklists/:zoneType/draft": {
    async control(w) {
      // An isolation-room draft must keep its airflow items; a doffing draft has no such rule.
      await w.fresh.checklistDraft("doffing_area");
      return { params: { zoneType: "doffing_area" } };
    },
  },

  // Observations of putting-on and removal
  "PUT /sequences/:key/draft": {
    // A key the network does not have yet makes a new sequence.
    newIds: ["params.key"],
    control: () => ({
      params: { key: "standard-removal-2" },
      body: {
        title: "Removing PPE, our order",
        kind: "removal",
        note: "Adapted for our wards",
        steps: [
          {
            key: "gown-and-gloves",
            text: "Gown and gloves off together",
            handHygiene: false,
            watchFor: ["out_of_order", "touched_face_or_clean_clothing"],
            reference: "Common practice",
          },
          { text: "Hand hygiene", handHygiene: true, watchFor: ["hand_hygiene_missed"] },
        ],
      },
    }),
  },
  "POST /sequences/:key/publish": {
    async control(w) {
      await freshSequenceDraft(w, "robust-publish");
      return { params: { key: "robust-publish" } };
    },
  },
  "DELETE /sequences/:key/draft": {
    async control(w) {
      await freshSequenceDraft(w, "robust-discard");
      return { params: { key: "robust-discard" } };
    },
  },
  "PUT /observations/:observationId": {
    newIds: ["params.observationId"],
    control: async (w) => {
      const sequence = await publishedSequence(w.app.deps.db, w.networkId);
      const body = buildObservation((await w.fresh.space()).id, sequence, {
        coachingNote: "Showed the glove-in-glove way",
      });
      body.steps[0]!.breaches = [
        { kind: "out_of_order", cause: "technique", spaceProblem: null, note: "Gown first" },
      ];
      return { params: { observationId: newId() }, body };
    },
  },
  // Live room pressure
  "POST /pressure-alarms/:alarmId/acknowledge": {
    control: async (w) => {
      const space = await w.fresh.space();
      const monitor = await insertMonitorH4(w.app.deps.db, { id: space.id, siteId: w.siteA });
      const alarm = await insertAlarmH4(w.app.deps.db, monitor);
      return { params: { alarmId: alarm.id }, body: { note: "Door closed, fan reset" } };
    },
  },
  "PUT /observation-settings": {
    control: () => ({ body: { retentionDays: 365 } }),
  },
  "GET /observations/:observationId": {
    control: async (w) => ({ params: { observationId: await freshObservation(w) } }),
  },

  // Audits
  "PUT /audits/:auditId": {
    newIds: ["params.auditId"],
    control: async (w) => ({
      params: { auditId: newId() },
      body: { spaceId: (await w.fresh.space()).id, startedAt: new Date().toISOString() },
    }),
  },
  "PUT /audits/:auditId/answers/:itemId": {
    newIds: ["body.id"],
    async control(w) {
      const { auditId, itemId } = await w.fresh.draftAudit();
      return {
        params: { auditId, itemId },
        body: {
          id: newId(),
          outcome: "fail",
          note: "Chair not labelled",
          count: null,
          choice: null,
        },
      };
    },
  },
  "POST /audits/:auditId/photos": {
    newIds: ["fields.id"],
    async control(w) {
      const { auditId, itemId } = await w.fresh.draftAudit();
      return {
        params: { auditId },
        upload: {
          field: "photo",
          file: await w.fresh.jpeg(),
          name: "door.jpg",
          fields: { id: newId(), itemId },
        },
        uploadSchema: auditPhotoFieldsSchema,
      };
    },
  },
  "POST /audits/:auditId/submit": {
    control: async (w) => ({ params: { auditId: (await w.fresh.draftAudit()).auditId } }),
  },
  "POST /audits/:auditId/amendments": {
    async control(w) {
      const { auditId, itemId } = await w.fresh.submittedAudit();
      return {
        params: { auditId },
        body: {
          itemId,
          outcome: "fail",
          note: "Seen again",
          reason: "Entered against the wrong item",
        },
      };
    },
  },

  // Corrective actions
  "POST /actions/:actionId/start": {
    control: async (w) => ({ params: { actionId: await w.fresh.action("to_fix") } }),
  },
  "POST /actions/:actionId/proofs": {
    newIds: ["fields.id"],
    control: async (w) => ({
      params: { actionId: await w.fresh.action("fixing") },
      upload: {
        field: "photo",
        file: await w.fresh.jpeg(),
        name: "fixed.jpg",
        fields: { id: newId() },
      },
      uploadSchema: proofFieldsSchema,
    }),
  },
  "POST /actions/:actionId/ask-check": {
    control: async (w) => ({
      params: { actionId: await w.fresh.action("fixing", true) },
      body: { note: "New labelled chair in place" },
    }),
  },
  "POST /actions/:actionId/confirm": {
    control: async (w) => ({
      params: { actionId: await w.fresh.action("to_check", true) },
      body: { note: "Seen in place" },
    }),
  },
  "POST /actions/:actionId/send-back": {
    control: async (w) => ({
      params: { actionId: await w.fresh.action("to_check", true) },
      body: { reason: "The label is missing" },
    }),
  },
  "POST /actions/:actionId/reopen": {
    control: async (w) => ({
      params: { actionId: await w.fresh.action("done") },
      body: { reason: "Chair gone again" },
    }),
  },
  "PUT /actions/:actionId/assignee": {
    control: async (w) => ({
      params: { actionId: await w.fresh.action("to_fix") },
      body: { assigneeId: w.callers["facilities lead @A"].id },
    }),
  },

  // Read routes that need a query
  "GET /committee/comparison": { control: () => ({ query: { from: "2026-01", to: "2026-06" } }) },
  "GET /committee/trends": { control: () => ({ query: { from: "2026-01", to: "2026-06" } }) },
  "GET /committee/sites/:siteId": {
    control: (w) => ({ params: { siteId: w.siteA }, query: { from: "2026-01", to: "2026-06" } }),
  },
  "GET /committee/comparison/export": {
    control: () => ({ query: { from: "2026-01", to: "2026-06" } }),
  },
  "GET /committee/audits/export": {
    control: () => ({ query: { from: "2026-01", to: "2026-06" } }),
  },
  "POST /sites/:siteId/pressure-upload-tokens": {
    control: (w) => ({ params: { siteId: w.siteA }, body: { name: "Building 2 gateway" } }),
  },
  "DELETE /sites/:siteId/pressure-upload-tokens/:tokenId": {
    control: async (w) => {
      const { token } = await insertUploadToken(
        w.app.deps.db,
        w.siteA,
        w.callers["administrator @A"].id,
      );
      return { params: { siteId: w.siteA, tokenId: token.id } };
    },
  },
  "POST /pressure/readings": {
    as: "nobody",
    control: async (w) => {
      const { secret } = await insertUploadToken(
        w.app.deps.db,
        w.siteA,
        w.callers["administrator @A"].id,
      );
      return {
        headers: { Authorization: `Bearer ${secret}` },
        body: {
          readings: [
            {
              monitorId: newMonitorId("robust"),
              measuredAt: new Date().toISOString(),
              pressure: -5,
              unit: "Pa",
              door: "closed",
            },
          ],
        },
      };
    },
  },
  "GET /committee/report": { control: () => ({ query: { from: "2026-01", to: "2026-06" } }) },
  "GET /committee/observations": {
    control: () => ({ query: { from: "2026-01", to: "2026-06" } }),
  },
  "GET /committee/observations/export": {
    control: () => ({ query: { from: "2026-01", to: "2026-06" } }),
  },
  "GET /committee/pressure": { control: () => ({ query: { from: "2026-01", to: "2026-06" } }) },
  "GET /committee/pressure/export": {
    control: () => ({ query: { from: "2026-01", to: "2026-06" } }),
  },
  "GET /sites/:siteId/actions": {
    control: (w) => ({
      params: { siteId: w.siteA },
      query: { state: "unfinished", overdue: "false" },
    }),
  },
  "GET /images/:imageId": {
    control: (w) => ({ params: { imageId: w.imageA }, query: { variant: "thumb" } }),
  },
};

/** Values for read routes' params, by name, when a read route has no example of its own. */
export async function readParams(world: World): Promise<Record<string, string>> {
  const person = await world.fresh.person();
  return {
    siteId: world.siteA,
    floorId: world.floorA,
    spaceId: world.spaceA,
    auditId: world.submittedAudit,
    actionId: await world.fresh.action("to_fix"),
    imageId: world.imageA,
    userId: person.id,
    zoneType: "anteroom",
    token: await world.fresh.link(world.invitedPerson, "invitation"),
  };
}
