import type { ActionState } from "@shared/workflow/action-workflow";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import type { Role } from "@shared/roles";

import { hashPassword } from "../../server/auth/password";
import {
  actionProofs,
  auditAnswers,
  audits,
  correctiveActions,
  checklistItems,
  checklistVersions,
  fixtures,
  floors,
  identityProviders,
  outbox,
  spaces,
  users,
} from "../../server/db/schema/index";
import {
  ensureDefaultChecklists,
  saveDraft as checklistSaveDraft,
} from "../../server/modules/checklists/checklists.service";
import { storeImage } from "../../server/lib/images";
import { saveDraft as sequenceSaveDraft } from "../../server/modules/observations/sequences.service";
import { insertSpace } from "../factories/audits";
import { buildObservation, publishedSequence } from "../factories/observations";
import { insertAlarmH4, insertMonitorH4 } from "../factories/pressure-h4";
import { freshMonitorId, insertMonitoredRoom } from "../factories/pressure-h3";
import { restoreSite, retireSite } from "../../server/modules/floors/floors.retirement";
import { apiRoutes } from "../../server/routes";
import {
  buildSite,
  insertGrant,
  insertNetwork,
  insertSite,
  insertUser,
} from "../factories/records";
import { api, createTestApp, testApp, type TestApp } from "../helpers/app";
import { issueTestLink } from "../helpers/links";
import { configureProvider, uniqueDomain } from "../helpers/identity-provider";
import { jpegWithGps, pngPlan } from "../factories/images";
import { sessionCookieFor, signInAs } from "../helpers/auth";
import { insertUploadToken, newMonitorId } from "../factories/pressure-h1";

// The designed access for every route, stated here independently of the server's own tables.
// Callers hold roles at site A (the site every sample resource belongs to), at site B (another
// site of the same network), or network-wide.
type Caller =
  | "administrator (network)"
  | "administrator @A"
  | "auditor @A"
  | "facilities lead @A"
  | "committee member (network)"
  | "committee member @A"
  | "auditor @B"
  | "administrator @B"
  | "facilities lead @B";

const callerGrants: Record<Caller, { role: Role; site: "A" | "B" | null }[]> = {
  "administrator (network)": [{ role: "administrator", site: null }],
  "administrator @A": [{ role: "administrator", site: "A" }],
  "auditor @A": [{ role: "auditor", site: "A" }],
  "facilities lead @A": [{ role: "facilities_lead", site: "A" }],
  "committee member (network)": [{ role: "committee_member", site: null }],
  "committee member @A": [{ role: "committee_member", site: "A" }],
  "auditor @B": [{ role: "auditor", site: "B" }],
  "administrator @B": [{ role: "administrator", site: "B" }],
  "facilities lead @B": [{ role: "facilities_lead", site: "B" }],
};
const everyone = Object.keys(callerGrants) as Caller[];
const atA: Caller[] = [
  "administrator (network)",
  "administrator @A",
  "auditor @A",
  "facilities lead @A",
  "committee member (network)",
  "committee member @A",
];

interface World {
  networkId: string;
  /** The auditor at site A, who owns audits prepared for callers that cannot start one. */
  auditorA: string;
  siteA: string;
  floorA: string;
  imageA: string;
  planPng: Buffer;
  signInEmail: string;
  /** The facilities lead at site A, whom actions can be given to. */
  leadA: string;
  /** The network-wide administrator, the one caller whose site retirement goes through. */
  networkAdmin: string;
  /** A hash of "matrix-password-1", so password changes need no hashing per call. */
  knownHash: string;
}

interface Call {
  url: string;
  body?: object;
  /** A file sent as multipart/form-data instead of a JSON body, with any text fields. */
  file?: { field: string; content: Buffer; name: string };
  fields?: Record<string, string>;
  /** Extra request headers (a pressure upload's bearer token). */
  headers?: Record<string, string>;
}

interface Sample {
  /** Makes what one call needs (fresh rows, a fresh link) and returns the request. */
  prepare: (world: World, caller: { userId: string | null }) => Promise<Call> | Call;
  ok: number;
  /** Callers who get `ok`. */
  allowed: Caller[];
  /** Signed-in callers who get 404 (the resource is not theirs to see); the rest get 403. */
  hidden?: Caller[];
}

const admins: Caller[] = ["administrator (network)", "administrator @A"];

/** Provider settings any network may store (nothing listens at that issuer). */
const matrixProviderBody = () => ({
  name: "Matrix Health",
  issuerUrl: "http://127.0.0.1:9",
  clientId: "matrix-client",
  clientSecret: "matrix-secret",
  domains: [uniqueDomain()],
  passwordAllowed: true,
  assumeVerifiedEmail: false,
});
const notAtA: Caller[] = everyone.filter((caller) => !atA.includes(caller));

/** A person holding a role at site A, optionally invited-only or deactivated. */
async function personAtA(world: World, state: "active" | "invited" | "deactivated" = "active") {
  const { db } = testApp().deps;
  const person = await insertUser(db, world.networkId, {
    password: undefined,
    deactivatedAt: state === "deactivated" ? new Date() : null,
  });
  if (state !== "invited")
    await db.update(users).set({ passwordHash: world.knownHash }).where(eq(users.id, person.id));
  const grant = await insertGrant(db, person.id, "auditor", world.siteA);
  return { person, grant };
}

const readers = atA;
const uploaders: Caller[] = [
  "administrator (network)",
  "administrator @A",
  "auditor @A",
  "facilities lead @A",
];
const square: [number, number][] = [
  [10, 10],
  [300, 10],
  [300, 300],
  [10, 300],
];

const retiredNow = () => ({
  retiredAt: new Date(),
  retirementId: crypto.randomUUID(),
});

async function spaceAtA(world: World, options: { retired?: boolean } = {}) {
  const { db } = testApp().deps;
  const [space] = await db
    .insert(spaces)
    .values({
      floorId: world.floorA,
      siteId: world.siteA,
      zoneType: "doffing_area",
      name: "Matrix doffing",
      polygon: square,
      ...(options.retired ? retiredNow() : {}),
    })
    .returning();
  return space!;
}

/** A floor of its own at site A, for calls that retire or delete it. */
async function floorAtA(world: World, options: { retired?: boolean } = {}) {
  const [floor] = await testApp()
    .deps.db.insert(floors)
    .values({
      siteId: world.siteA,
      building: "Matrix block",
      level: 9,
      name: "Matrix spare",
      ...(options.retired ? retiredNow() : {}),
    })
    .returning();
  return floor!.id;
}

const system = { userId: null, requestId: null };
/** Site A as every other sample needs it: not retired. */
const siteAActive = (world: World) =>
  restoreSite(testApp().deps.db, world.networkId, world.siteA, {}, system);
const siteARetired = (world: World) =>
  retireSite(testApp().deps.db, world.networkId, world.siteA, {}, system);

async function fixtureAtA(world: World) {
  const space = await spaceAtA(world);
  const [fixture] = await testApp()
    .deps.db.insert(fixtures)
    .values({ spaceId: space.id, siteId: world.siteA, kind: "dirty_chair", x: 50, y: 50 })
    .returning();
  return fixture!;
}

const auditors: Caller[] = ["auditor @A"];

/** An audit of a fresh doffing area at site A started by the caller (or the auditor at A). */
async function auditAtA(
  world: World,
  caller: { userId: string | null },
  status: "draft" | "submitted" = "draft",
) {
  const space = await spaceAtA(world);
  const auditId = crypto.randomUUID();
  const { db } = testApp().deps;
  await ensureDefaultChecklists(db, world.networkId);
  const [version] = await db
    .select()
    .from(checklistVersions)
    .where(
      and(
        eq(checklistVersions.networkId, world.networkId),
        eq(checklistVersions.zoneType, "doffing_area"),
      ),
    );
  await db.insert(audits).values({
    id: auditId,
    siteId: world.siteA,
    spaceId: space.id,
    checklistVersionId: version!.id,
    auditorId: caller.userId ?? world.auditorA,
    startedAt: new Date(),
    status,
  });
  const [item] = await db
    .select()
    .from(checklistItems)
    .where(eq(checklistItems.versionId, version!.id))
    .limit(1);
  return { auditId, spaceId: space.id, itemId: item!.id };
}

/** A corrective action at site A in the given state; with proof of the current attempt when asked. */
async function actionAtA(world: World, state: ActionState, withProof = false) {
  const space = await spaceAtA(world);
  const { db } = testApp().deps;
  const now = new Date();
  const [action] = await db
    .insert(correctiveActions)
    .values({
      siteId: world.siteA,
      spaceId: space.id,
      floorId: world.floorA,
      itemKey: "matrix-item",
      title: "Dirty chair labelled",
      severity: "major",
      state,
      assigneeId: world.leadA,
      openedAt: now,
      dueAt: new Date(now.getTime() + 7 * 24 * 3600 * 1000),
      closedAt: state === "done" ? now : null,
      x: 100,
      y: 100,
    })
    .returning();
  if (withProof) {
    await db
      .insert(actionProofs)
      .values({ actionId: action!.id, imageId: world.imageA, round: 0, uploadedBy: null });
  }
  return action!.id;
}

const leadsAtA: Caller[] = ["facilities lead @A"];
const assigners: Caller[] = [...admins, "facilities lead @A"];

/** An observation recorded at site A by its auditor, over HTTP. */
async function observationAtA(world: World): Promise<string> {
  const id = crypto.randomUUID();
  const body = buildObservation(
    (await spaceAtA(world)).id,
    await publishedSequence(testApp().deps.db, world.networkId),
  );
  const reply = await api(undefined, { cookie: await sessionCookieFor(world.auditorA) })
    .put(`/api/observations/${id}`)
    .send(body);
  if (reply.status !== 201) throw new Error(`observation: ${reply.status}`);
  return id;
}

const samples: Record<string, Sample> = {
  "GET /sites/:siteId/actions": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/actions?state=unfinished` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /sites/:siteId/actions/export": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/actions/export` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /my/actions": { prepare: () => ({ url: "/api/my/actions" }), ok: 200, allowed: everyone },
  "GET /my/checks": {
    prepare: () => ({ url: "/api/my/checks" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /mail/undelivered": {
    prepare: () => ({ url: "/api/mail/undelivered" }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "POST /mail/:mailId/resend": {
    prepare: async (w) => ({ url: `/api/mail/${await uncertainMailTo(w.leadA)}/resend`, body: {} }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "GET /actions/:actionId": {
    prepare: async (w) => ({ url: `/api/actions/${await actionAtA(w, "to_fix")}` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "POST /actions/:actionId/start": {
    prepare: async (w) => ({ url: `/api/actions/${await actionAtA(w, "to_fix")}/start` }),
    ok: 200,
    allowed: leadsAtA,
    hidden: notAtA,
  },
  "POST /actions/:actionId/proofs": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "fixing")}/proofs`,
      file: { field: "photo", content: w.planPng, name: "fixed.png" },
      fields: { id: crypto.randomUUID() },
    }),
    ok: 201,
    allowed: leadsAtA,
    hidden: notAtA,
  },
  "POST /actions/:actionId/ask-check": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "fixing", true)}/ask-check`,
      body: { note: "New labelled chair in place" },
    }),
    ok: 200,
    allowed: leadsAtA,
    hidden: notAtA,
  },
  "POST /actions/:actionId/confirm": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "to_check", true)}/confirm`,
      body: { note: "Seen in place" },
    }),
    ok: 200,
    allowed: auditors,
    hidden: notAtA,
  },
  "POST /actions/:actionId/send-back": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "to_check", true)}/send-back`,
      body: { reason: "The label is missing" },
    }),
    ok: 200,
    allowed: auditors,
    hidden: notAtA,
  },
  "POST /actions/:actionId/reopen": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "done")}/reopen`,
      body: { reason: "Chair gone again" },
    }),
    ok: 200,
    allowed: auditors,
    hidden: notAtA,
  },
  "PUT /actions/:actionId/assignee": {
    prepare: async (w) => ({
      url: `/api/actions/${await actionAtA(w, "to_fix")}/assignee`,
      body: { assigneeId: w.leadA },
    }),
    ok: 200,
    allowed: assigners,
    hidden: notAtA,
  },
  "GET /sites/:siteId/action-assignees": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/action-assignees` }),
    ok: 200,
    allowed: assigners,
    hidden: notAtA,
  },
  "GET /sites/:siteId/due-policy": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/due-policy` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "PUT /sites/:siteId/due-policy": {
    prepare: (w) => ({
      url: `/api/sites/${w.siteA}/due-policy`,
      body: {
        critical: { amount: 12, unit: "hours" },
        major: { amount: 5, unit: "days" },
        minor: { amount: 21, unit: "days" },
      },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /sites/:siteId/pressure-settings": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/pressure-settings` }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "PUT /sites/:siteId/pressure-settings": {
    prepare: (w) => ({
      url: `/api/sites/${w.siteA}/pressure-settings`,
      body: {
        graceSeconds: 90,
        doorGraceSeconds: 300,
        actionLimitMinutes: 20,
        recipients: [w.leadA],
      },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /committee/comparison": {
    prepare: () => ({ url: "/api/committee/comparison?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/trends": {
    prepare: () => ({ url: "/api/committee/trends?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/sites/:siteId": {
    prepare: (w) => ({ url: `/api/committee/sites/${w.siteA}?from=2026-01&to=2026-12` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /committee/comparison/export": {
    prepare: () => ({ url: "/api/committee/comparison/export?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/audits/export": {
    prepare: () => ({ url: "/api/committee/audits/export?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/report": {
    prepare: () => ({ url: "/api/committee/report?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/observations": {
    prepare: () => ({ url: "/api/committee/observations?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/observations/export": {
    prepare: () => ({ url: "/api/committee/observations/export?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/pressure": {
    prepare: () => ({ url: "/api/committee/pressure?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /committee/pressure/export": {
    prepare: () => ({ url: "/api/committee/pressure/export?from=2026-01&to=2026-12" }),
    ok: 200,
    allowed: everyone,
  },
  "GET /checklists": { prepare: () => ({ url: "/api/checklists" }), ok: 200, allowed: everyone },
  "PUT /checklists/:zoneType/draft": {
    prepare: () => ({
      url: "/api/checklists/anteroom/draft",
      body: {
        title: "Anteroom checks",
        items: [{ text: "Doors close", severity: "major", response: "check", photoOnFail: false }],
      },
    }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "POST /checklists/:zoneType/publish": {
    async prepare(world) {
      await checklistSaveDraft(
        testApp().deps.db,
        world.networkId,
        "donning_zone",
        {
          title: "Donning",
          items: [{ text: "Stock", severity: "major", response: "check", photoOnFail: false }],
        },
        { userId: null, requestId: null },
      );
      return { url: "/api/checklists/donning_zone/publish" };
    },
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "DELETE /checklists/:zoneType/draft": {
    async prepare(world) {
      await checklistSaveDraft(
        testApp().deps.db,
        world.networkId,
        "doffing_area",
        {
          title: "Doffing",
          items: [{ text: "Bins", severity: "major", response: "check", photoOnFail: false }],
        },
        { userId: null, requestId: null },
      );
      return { url: "/api/checklists/doffing_area/draft" };
    },
    ok: 204,
    allowed: ["administrator (network)"],
  },
  "PUT /audits/:auditId": {
    prepare: async (w) => ({
      url: `/api/audits/${crypto.randomUUID()}`,
      body: { spaceId: (await spaceAtA(w)).id, startedAt: new Date().toISOString() },
    }),
    ok: 201,
    allowed: auditors,
    hidden: notAtA,
  },
  "GET /audits/:auditId": {
    prepare: async (w, caller) => ({ url: `/api/audits/${(await auditAtA(w, caller)).auditId}` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "PUT /audits/:auditId/answers/:itemId": {
    async prepare(w, caller) {
      const { auditId, itemId } = await auditAtA(w, caller);
      return {
        url: `/api/audits/${auditId}/answers/${itemId}`,
        body: { id: crypto.randomUUID(), outcome: "pass" },
      };
    },
    ok: 200,
    allowed: auditors,
    hidden: notAtA,
  },
  "POST /audits/:auditId/photos": {
    async prepare(w, caller) {
      const { auditId, itemId } = await auditAtA(w, caller);
      return {
        url: `/api/audits/${auditId}/photos`,
        file: { field: "photo", content: w.planPng, name: "p.png" },
        fields: { id: crypto.randomUUID(), itemId },
      };
    },
    ok: 201,
    allowed: auditors,
    hidden: notAtA,
  },
  "POST /audits/:auditId/submit": {
    // Already submitted: the answer is the same audit again, which every auditor of the site gets.
    prepare: async (w, caller) => ({
      url: `/api/audits/${(await auditAtA(w, caller, "submitted")).auditId}/submit`,
    }),
    ok: 200,
    allowed: auditors,
    hidden: notAtA,
  },
  "POST /audits/:auditId/amendments": {
    async prepare(w, caller) {
      const { auditId, itemId } = await auditAtA(w, caller, "submitted");
      await testApp()
        .deps.db.insert(auditAnswers)
        .values({ id: crypto.randomUUID(), auditId, itemId, outcome: "fail" });
      return {
        url: `/api/audits/${auditId}/amendments`,
        body: { itemId, outcome: "pass", reason: "Entered against the wrong item" },
      };
    },
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /spaces/:spaceId/audits": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}/audits` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /spaces/:spaceId/floor": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}/floor` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /spaces/:spaceId/pressure": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await insertMonitoredRoom(testApp().deps.db, w.siteA)).space.id}/pressure?range=30d`,
    }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "PUT /spaces/:spaceId/monitor": {
    prepare: async (w) => {
      const floor = { id: w.floorA, siteId: w.siteA };
      const room = await insertSpace(testApp().deps.db, floor, "isolation_room");
      return { url: `/api/spaces/${room.id}/monitor`, body: { monitorId: freshMonitorId() } };
    },
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "DELETE /spaces/:spaceId/monitor": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await insertMonitoredRoom(testApp().deps.db, w.siteA)).space.id}/monitor`,
    }),
    ok: 204,
    allowed: admins,
    hidden: notAtA,
  },
  "PATCH /spaces/:spaceId/cadence": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await spaceAtA(w)).id}/cadence`,
      body: { cadenceDays: 14 },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /my/due": { prepare: () => ({ url: "/api/my/due" }), ok: 200, allowed: everyone },
  "GET /sites/:siteId/schedule": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/schedule` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /sites/:siteId/floors": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/floors` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "POST /sites/:siteId/floors": {
    prepare: (w) => ({
      url: `/api/sites/${w.siteA}/floors`,
      body: { building: "Matrix block", level: 2, name: "Level 2" },
    }),
    ok: 201,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /floors/:floorId": {
    prepare: (w) => ({ url: `/api/floors/${w.floorA}` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "PATCH /floors/:floorId": {
    prepare: (w) => ({ url: `/api/floors/${w.floorA}`, body: { name: `Level ${Math.random()}` } }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "PUT /floors/:floorId/plan": {
    prepare: (w) => ({
      url: `/api/floors/${w.floorA}/plan`,
      file: { field: "plan", content: w.planPng, name: "plan.png" },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "PUT /floors/:floorId/scale": {
    prepare: (w) => ({
      url: `/api/floors/${w.floorA}/scale`,
      body: { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: 2 },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /floors/:floorId/suites": {
    prepare: (w) => ({ url: `/api/floors/${w.floorA}/suites`, body: { name: "Suite M" } }),
    ok: 201,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /floors/:floorId/spaces": {
    prepare: (w) => ({
      url: `/api/floors/${w.floorA}/spaces`,
      body: { zoneType: "donning_zone", name: "Matrix donning", polygon: square },
    }),
    ok: 201,
    allowed: admins,
    hidden: notAtA,
  },
  "PATCH /spaces/:spaceId": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await spaceAtA(w)).id}`,
      body: { name: "Renamed space" },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "DELETE /spaces/:spaceId": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}` }),
    ok: 204,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /spaces/:spaceId/retire": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}/retire`, body: {} }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /spaces/:spaceId/restore": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await spaceAtA(w, { retired: true })).id}/restore`,
      body: { reason: "Ward reopened" },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "DELETE /floors/:floorId": {
    prepare: async (w) => ({ url: `/api/floors/${await floorAtA(w)}` }),
    ok: 204,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /floors/:floorId/retire": {
    prepare: async (w) => ({ url: `/api/floors/${await floorAtA(w)}/retire`, body: {} }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /floors/:floorId/restore": {
    prepare: async (w) => ({
      url: `/api/floors/${await floorAtA(w, { retired: true })}/restore`,
      body: {},
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /sites/:siteId/retired": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/retired` }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  // Site A itself, so every caller's answer is about a site they may or may not hold a role at;
  // only the network-wide administrator's call changes it, and every other call leaves A active.
  "POST /sites/:siteId/retire": {
    prepare: async (w) => {
      await siteAActive(w);
      return { url: `/api/sites/${w.siteA}/retire`, body: {} };
    },
    ok: 200,
    allowed: ["administrator (network)"],
    hidden: notAtA,
  },
  "POST /sites/:siteId/restore": {
    prepare: async (w, caller) => {
      if (caller.userId === w.networkAdmin) await siteARetired(w);
      else await siteAActive(w);
      return { url: `/api/sites/${w.siteA}/restore`, body: {} };
    },
    ok: 200,
    allowed: ["administrator (network)"],
    hidden: notAtA,
  },
  "GET /retired-sites": {
    prepare: () => ({ url: "/api/retired-sites" }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "POST /spaces/:spaceId/fixtures": {
    prepare: async (w) => ({
      url: `/api/spaces/${(await spaceAtA(w)).id}/fixtures`,
      body: { kind: "hand_rub_station", x: 100, y: 100 },
    }),
    ok: 201,
    allowed: admins,
    hidden: notAtA,
  },
  "PATCH /fixtures/:fixtureId": {
    prepare: async (w) => ({ url: `/api/fixtures/${(await fixtureAtA(w)).id}`, body: { x: 60 } }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "DELETE /fixtures/:fixtureId": {
    prepare: async (w) => ({ url: `/api/fixtures/${(await fixtureAtA(w)).id}` }),
    ok: 204,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /sites/:siteId/images": {
    prepare: async (w) => ({
      url: `/api/sites/${w.siteA}/images`,
      file: {
        field: "photo",
        content: await jpegWithGps({
          colour: `#${Math.floor(Math.random() * 0xffffff)
            .toString(16)
            .padStart(6, "0")}`,
        }),
        name: "p.jpg",
      },
    }),
    ok: 201,
    allowed: uploaders,
    hidden: notAtA,
  },
  "GET /images/:imageId": {
    prepare: (w) => ({ url: `/api/images/${w.imageA}?variant=thumb` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /health": { prepare: () => ({ url: "/api/health" }), ok: 200, allowed: everyone },
  "GET /app-config": { prepare: () => ({ url: "/api/app-config" }), ok: 200, allowed: everyone },
  "GET /dev/mailbox": {
    prepare: () => ({ url: "/api/dev/mailbox" }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "POST /auth/sign-in": {
    prepare: (world) => ({
      url: "/api/auth/sign-in",
      body: { email: world.signInEmail, password: "matrix-password-1" },
    }),
    ok: 200,
    allowed: everyone,
  },
  "POST /auth/sign-out": {
    prepare: () => ({ url: "/api/auth/sign-out" }),
    ok: 204,
    allowed: everyone,
  },
  "GET /auth/me": { prepare: () => ({ url: "/api/auth/me" }), ok: 200, allowed: everyone },
  "POST /auth/sign-in/method": {
    prepare: (world) => ({ url: "/api/auth/sign-in/method", body: { email: world.signInEmail } }),
    ok: 200,
    allowed: everyone,
  },
  // Both answer the browser with a redirect: to the provider, or to the page saying why not.
  "GET /auth/provider/start": {
    prepare: (world) => ({
      url: `/api/auth/provider/start?email=${encodeURIComponent(world.signInEmail)}`,
    }),
    ok: 302,
    allowed: everyone,
  },
  "GET /auth/provider/callback": {
    prepare: () => ({ url: "/api/auth/provider/callback?state=matrix&code=matrix" }),
    ok: 302,
    allowed: everyone,
  },
  "GET /admin/identity-provider": {
    prepare: () => ({ url: "/api/admin/identity-provider" }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "PUT /admin/identity-provider": {
    prepare: () => ({ url: "/api/admin/identity-provider", body: matrixProviderBody() }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "DELETE /admin/identity-provider": {
    prepare: () => ({ url: "/api/admin/identity-provider" }),
    ok: 204,
    allowed: ["administrator (network)"],
  },
  "POST /admin/identity-provider/test": {
    async prepare(world) {
      const { db } = testApp().deps;
      const [stored] = await db
        .select({ id: identityProviders.id })
        .from(identityProviders)
        .where(eq(identityProviders.networkId, world.networkId));
      if (!stored) {
        // Nothing listens there: the test answers 200 with the discovery step failed.
        await configureProvider(
          world.networkId,
          { issuer: "http://127.0.0.1:9", clientId: "matrix", clientSecret: "matrix-secret" },
          { domains: [uniqueDomain()] },
        );
      }
      return { url: "/api/admin/identity-provider/test" };
    },
    ok: 200,
    allowed: ["administrator (network)"],
  },

  "PATCH /auth/me": {
    prepare: () => ({ url: "/api/auth/me", body: { name: "Renamed In Matrix" } }),
    ok: 200,
    allowed: everyone,
  },
  "POST /auth/me/password": {
    async prepare(world, caller) {
      if (caller.userId) {
        await testApp()
          .deps.db.update(users)
          .set({ passwordHash: world.knownHash })
          .where(eq(users.id, caller.userId));
      }
      return {
        url: "/api/auth/me/password",
        body: {
          currentPassword: "matrix-password-1",
          newPassword: "a new long passphrase for the matrix",
        },
      };
    },
    ok: 204,
    allowed: everyone,
  },
  "GET /invitations/:token": {
    async prepare(world) {
      const { person } = await personAtA(world, "invited");
      return { url: `/api/invitations/${await issueTestLink(person.id, "invitation")}` };
    },
    ok: 200,
    allowed: everyone,
  },
  "POST /invitations/:token/accept": {
    async prepare(world) {
      const { person } = await personAtA(world, "invited");
      return {
        url: `/api/invitations/${await issueTestLink(person.id, "invitation")}/accept`,
        body: { password: "joining the matrix today" },
      };
    },
    ok: 200,
    allowed: everyone,
  },
  "POST /auth/password-reset": {
    prepare: () => ({
      url: "/api/auth/password-reset",
      body: { email: "somebody-or-nobody@example.org" },
    }),
    ok: 202,
    allowed: everyone,
  },
  "GET /auth/password-reset/:token": {
    async prepare(world) {
      const { person } = await personAtA(world);
      return {
        url: `/api/auth/password-reset/${await issueTestLink(person.id, "password_reset")}`,
      };
    },
    ok: 200,
    allowed: everyone,
  },
  "POST /auth/password-reset/:token": {
    async prepare(world) {
      const { person } = await personAtA(world);
      return {
        url: `/api/auth/password-reset/${await issueTestLink(person.id, "password_reset")}`,
        body: { password: "a fresh passphrase after reset" },
      };
    },
    ok: 200,
    allowed: everyone,
  },
  "GET /sites/:siteId/pressure-upload-tokens": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/pressure-upload-tokens` }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "POST /sites/:siteId/pressure-upload-tokens": {
    prepare: (w) => ({
      url: `/api/sites/${w.siteA}/pressure-upload-tokens`,
      body: { name: "Matrix gateway" },
    }),
    ok: 201,
    allowed: admins,
    hidden: notAtA,
  },
  "DELETE /sites/:siteId/pressure-upload-tokens/:tokenId": {
    prepare: async (w) => {
      const { token } = await insertUploadToken(testApp().deps.db, w.siteA, w.networkAdmin);
      return { url: `/api/sites/${w.siteA}/pressure-upload-tokens/${token.id}` };
    },
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  // No session decides: the site's upload token does, whoever else is signed in.
  "POST /pressure/readings": {
    prepare: async (w) => {
      const { secret } = await insertUploadToken(testApp().deps.db, w.siteA, w.networkAdmin);
      return {
        url: "/api/pressure/readings",
        headers: { Authorization: `Bearer ${secret}` },
        body: {
          readings: [
            {
              monitorId: newMonitorId("matrix"),
              measuredAt: new Date().toISOString(),
              pressure: -5,
              unit: "Pa",
            },
          ],
        },
      };
    },
    ok: 200,
    allowed: everyone,
  },
  "GET /sites": { prepare: () => ({ url: "/api/sites" }), ok: 200, allowed: everyone },
  "POST /sites": {
    prepare: () => ({ url: "/api/sites", body: buildSite() }),
    ok: 201,
    allowed: ["administrator (network)"],
  },
  "GET /sites/:siteId": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}` }),
    ok: 200,
    allowed: atA,
    hidden: notAtA,
  },
  "PATCH /sites/:siteId": {
    prepare: (w) => ({
      url: `/api/sites/${w.siteA}`,
      body: { address: `${Math.random()} Matrix Road` },
    }),
    ok: 200,
    allowed: admins,
    hidden: notAtA,
  },
  "GET /people": {
    prepare: () => ({ url: "/api/people" }),
    ok: 200,
    allowed: [...admins, "administrator @B"],
  },
  "POST /people/invitations": {
    prepare: (w) => ({
      url: "/api/people/invitations",
      body: {
        email: `invitee-${crypto.randomUUID()}@example.org`,
        name: "Matrix Invitee",
        grants: [{ role: "auditor", siteId: w.siteA }],
      },
    }),
    ok: 201,
    allowed: admins,
  },
  "GET /people/:userId": {
    prepare: async (w) => ({ url: `/api/people/${(await personAtA(w)).person.id}` }),
    ok: 200,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  "POST /people/:userId/grants": {
    prepare: async (w) => ({
      url: `/api/people/${(await personAtA(w)).person.id}/grants`,
      body: { role: "facilities_lead", siteId: w.siteA },
    }),
    ok: 201,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  "DELETE /people/:userId/grants/:grantId": {
    async prepare(w) {
      const { person, grant } = await personAtA(w);
      return { url: `/api/people/${person.id}/grants/${grant.id}` };
    },
    ok: 200,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  "POST /people/:userId/deactivate": {
    prepare: async (w) => ({
      url: `/api/people/${(await personAtA(w)).person.id}/deactivate`,
      body: { reason: "left" },
    }),
    ok: 200,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  "POST /people/:userId/reactivate": {
    prepare: async (w) => ({
      url: `/api/people/${(await personAtA(w, "deactivated")).person.id}/reactivate`,
      body: {},
    }),
    ok: 200,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  "POST /people/:userId/invitation": {
    prepare: async (w) => ({
      url: `/api/people/${(await personAtA(w, "invited")).person.id}/invitation`,
      body: {},
    }),
    ok: 200,
    allowed: admins,
    hidden: ["administrator @B"],
  },
  // Observations of putting-on and removal
  "GET /sequences": {
    prepare: () => ({ url: "/api/sequences" }),
    ok: 200,
    allowed: ["administrator (network)", "auditor @A", "auditor @B"],
  },
  "PUT /sequences/:key/draft": {
    prepare: () => ({
      url: "/api/sequences/standard-removal-2/draft",
      body: {
        title: "Removing PPE, our order",
        kind: "removal",
        steps: [{ text: "Gloves off", handHygiene: false, watchFor: ["out_of_order"] }],
      },
    }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "POST /sequences/:key/publish": {
    async prepare(world) {
      await sequenceSaveDraft(
        testApp().deps.db,
        world.networkId,
        "matrix-publish",
        {
          title: "Ours",
          kind: "removal",
          steps: [{ text: "Gloves", handHygiene: false, watchFor: [] }],
        },
        system,
      );
      return { url: "/api/sequences/matrix-publish/publish" };
    },
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "DELETE /sequences/:key/draft": {
    async prepare(world) {
      await sequenceSaveDraft(
        testApp().deps.db,
        world.networkId,
        "matrix-discard",
        {
          title: "Ours",
          kind: "removal",
          steps: [{ text: "Gloves", handHygiene: false, watchFor: [] }],
        },
        system,
      );
      return { url: "/api/sequences/matrix-discard/draft" };
    },
    ok: 204,
    allowed: ["administrator (network)"],
  },
  "PUT /observations/:observationId": {
    prepare: async (w) => ({
      url: `/api/observations/${crypto.randomUUID()}`,
      body: buildObservation(
        (await spaceAtA(w)).id,
        await publishedSequence(testApp().deps.db, w.networkId),
      ),
    }),
    ok: 201,
    allowed: auditors,
    hidden: notAtA,
  },
  "GET /observations/:observationId": {
    prepare: async (w) => ({ url: `/api/observations/${await observationAtA(w)}` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /spaces/:spaceId/observations": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}/observations` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "GET /observation-settings": {
    prepare: () => ({ url: "/api/observation-settings" }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
  "GET /sites/:siteId/pressure-now": {
    prepare: (w) => ({ url: `/api/sites/${w.siteA}/pressure-now` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "POST /pressure-alarms/:alarmId/acknowledge": {
    prepare: async (w) => {
      const { db } = testApp().deps;
      const monitor = await insertMonitorH4(db, await spaceAtA(w));
      const alarm = await insertAlarmH4(db, monitor);
      return {
        url: `/api/pressure-alarms/${alarm.id}/acknowledge`,
        body: { note: "Door closed" },
      };
    },
    ok: 200,
    allowed: uploaders,
    hidden: notAtA,
  },
  "GET /spaces/:spaceId/pressure-24h": {
    prepare: async (w) => ({ url: `/api/spaces/${(await spaceAtA(w)).id}/pressure-24h` }),
    ok: 200,
    allowed: readers,
    hidden: notAtA,
  },
  "PUT /observation-settings": {
    prepare: () => ({ url: "/api/observation-settings", body: { retentionDays: 365 } }),
    ok: 200,
    allowed: ["administrator (network)"],
  },
};

/** An e-mail to a person of the matrix network whose sending was interrupted. */
async function uncertainMailTo(userId: string): Promise<string> {
  const { db } = testApp().deps;
  const [person] = await db.select({ email: users.email }).from(users).where(eq(users.id, userId));
  const [row] = await db
    .insert(outbox)
    .values({
      topic: "action_assigned",
      recipient: person!.email,
      subject: "Corrective action for you",
      textBody: "Open the action",
      status: "uncertain",
      attempts: 1,
    })
    .returning({ id: outbox.id });
  return row!.id;
}

const routeKey = (route: (typeof apiRoutes)[number]) =>
  `${route.method.toUpperCase()} ${route.path}`;

describe("role matrix: every registered route, as every role, another site's member and signed out", () => {
  const world = {} as World;
  const userIds = {} as Record<Caller, string>;
  let siteBId = "";
  let matrixApp: TestApp;

  beforeAll(async () => {
    matrixApp = createTestApp({ LINTEL_DEMO: "1" }, undefined, {
      mailCatcherDir: mkdtempSync(path.join(os.tmpdir(), "lintel-mailbox-")),
    });
    const { db } = testApp().deps;
    const network = await insertNetwork(db);
    world.networkId = network.id;
    world.knownHash = await hashPassword("matrix-password-1");
    world.siteA = (await insertSite(db, network.id)).id;
    world.planPng = await pngPlan(400, 300);
    const [floor] = await db
      .insert(floors)
      .values({ siteId: world.siteA, building: "Matrix block", level: 1, name: "Level 1" })
      .returning();
    world.floorA = floor!.id;
    world.imageA = (
      await storeImage(testApp().deps, {
        siteId: world.siteA,
        uploadedBy: null,
        buffer: world.planPng,
        field: "photo",
      })
    ).id;
    siteBId = (await insertSite(db, network.id)).id;
    const signInUser = await insertUser(db, network.id, { password: "matrix-password-1" });
    world.signInEmail = signInUser.email;
    for (const caller of everyone) {
      const grants = callerGrants[caller].map((g) => ({
        role: g.role,
        siteId: g.site === null ? null : g.site === "A" ? world.siteA : siteBId,
      }));
      userIds[caller] = (await signInAs(network.id, grants)).user.id;
    }
    world.auditorA = userIds["auditor @A"];
    world.leadA = userIds["facilities lead @A"];
    world.networkAdmin = userIds["administrator (network)"];
  });
  afterAll(async () => {
    await matrixApp.database.close();
    rmSync(matrixApp.deps.mailCatcherDir!, { recursive: true, force: true });
  });

  it("when a route is registered, then the matrix has a designed answer for it", () => {
    const registered = apiRoutes.map(routeKey).sort();
    expect(Object.keys(samples).sort()).toEqual(registered);
  });

  it("when a committee member calls any write that is not about their own account, then it is refused with 403", () => {
    // Each of these rows is also called for real below, as every caller.
    const ownAccount = ["/auth/", "/invitations/"];
    // A pressure upload is authorised by a site's upload token, never by the person signed in.
    const byToken = ["/pressure/readings"];
    const writes = apiRoutes.filter(
      (route) =>
        route.method !== "get" &&
        !ownAccount.some((p) => route.path.startsWith(p)) &&
        !byToken.includes(route.path),
    );
    expect(writes.length).toBeGreaterThan(30);
    for (const committee of ["committee member (network)", "committee member @A"] as const) {
      for (const route of writes) {
        const sample = samples[routeKey(route)]!;
        expect(sample.allowed, routeKey(route)).not.toContain(committee);
        expect(sample.hidden ?? [], routeKey(route)).not.toContain(committee);
      }
    }
  });

  for (const route of apiRoutes) {
    const key = routeKey(route);
    describe(key, () => {
      const sample = samples[key];
      if (!sample) return;
      const call = async (caller: Caller | null) => {
        const userId = caller ? userIds[caller] : null;
        const { url, body, file, fields, headers } = await sample.prepare(world, { userId });
        const cookie = userId ? await sessionCookieFor(userId) : undefined;
        const request = api(matrixApp.app, { cookie }).request(route.method, url);
        for (const [name, value] of Object.entries(headers ?? {})) request.set(name, value);
        if (file) {
          for (const [name, value] of Object.entries(fields ?? {})) request.field(name, value);
          return request.attach(file.field, file.content, file.name);
        }
        return body ? request.send(body) : request;
      };

      it(`when signed out, then ${route.access.kind === "public" ? sample.ok : 401}`, async () => {
        const response = await call(null);
        expect(response.status, JSON.stringify(response.body)).toBe(
          route.access.kind === "public" ? sample.ok : 401,
        );
      });

      for (const caller of everyone) {
        const expected = sample.allowed.includes(caller)
          ? sample.ok
          : sample.hidden?.includes(caller)
            ? 404
            : 403;
        it(`when called by ${caller}, then ${expected}`, async () => {
          const response = await call(caller);
          expect(response.status, JSON.stringify(response.body)).toBe(expected);
          if (expected >= 400) expect(response.body.error.code).toBeTypeOf("string");
        });
      }
    });
  }
});
