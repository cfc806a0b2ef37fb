import { actionStates, type ActionState } from "@shared/workflow/action-workflow";
import { randomUUID } from "node:crypto";

import { and, eq } from "drizzle-orm";

import type { Role } from "@shared/roles";

import { hashPassword } from "../../server/auth/password";
import {
  actionProofs,
  checklistItems,
  checklistVersions,
  correctiveActions,
  fixtures,
  outbox,
  users,
} from "../../server/db/schema/index";
import { storeImage } from "../../server/lib/images";
import {
  ensureDefaultChecklists,
  saveDraft,
} from "../../server/modules/checklists/checklists.service";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps, pngPlan } from "../factories/images";
import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api, type TestApp } from "./app";
import { sessionCookieFor } from "./auth";
import { issueTestLink } from "./links";

/** The password every person of the world signs in with (hashed once). */
export const worldPassword = "robust-password-1";

export type CallerName =
  | "administrator (network)"
  | "administrator @A"
  | "auditor @A"
  | "facilities lead @A"
  | "committee member @A";

const callerGrants: Record<CallerName, { role: Role; atA: boolean }> = {
  "auditor @A": { role: "auditor", atA: true },
  "facilities lead @A": { role: "facilities_lead", atA: true },
  "administrator @A": { role: "administrator", atA: true },
  "administrator (network)": { role: "administrator", atA: false },
  "committee member @A": { role: "committee_member", atA: true },
};
/** In this order the walk picks the first caller a route admits. */
export const callerNames = Object.keys(callerGrants) as CallerName[];

/**
 * One seeded network for the robustness walk: sites, a floor with a plan, spaces, fixtures,
 * published checklists, draft and submitted audits, corrective actions, people in every state and
 * an image — with helpers that make a fresh row of a kind when a route's control consumes one.
 */
export interface World {
  app: TestApp;
  networkId: string;
  siteA: string;
  siteB: string;
  floorA: string;
  spaceA: string;
  imageA: string;
  planPng: Buffer;
  passwordHash: string;
  callers: Record<
    CallerName,
    { id: string; email: string; grants: { role: Role; siteId: string | null }[] }
  >;
  /** A submitted audit with a failure, made and submitted over HTTP (it opened real actions). */
  submittedAudit: string;
  /** A draft audit of the auditor at A. */
  draftAudit: string;
  /** A person with a pending invitation at A. */
  invitedPerson: string;
  /** Fresh rows, for controls that use one up. */
  fresh: {
    space: () => Promise<{ id: string }>;
    fixture: () => Promise<{ id: string }>;
    person: (
      state?: "active" | "invited" | "deactivated",
    ) => Promise<{ id: string; email: string; grantId: string }>;
    action: (state: ActionState, withProof?: boolean) => Promise<string>;
    /** A draft audit of the auditor at A, with one of its items. */
    draftAudit: () => Promise<{ auditId: string; itemId: string }>;
    submittedAudit: () => Promise<{ auditId: string; itemId: string }>;
    link: (userId: string, purpose: "invitation" | "password_reset") => Promise<string>;
    checklistDraft: (
      zoneType: "anteroom" | "donning_zone" | "isolation_room" | "doffing_area",
    ) => Promise<void>;
    jpeg: () => Promise<Buffer>;
    /** A floor of site A with one space, nothing audited. */
    floor: () => Promise<{ id: string }>;
    /** A site of the network with a floor and a space, nothing audited. */
    site: () => Promise<{ id: string }>;
    /** Retires a place over HTTP as an administrator would, so a restore has something to undo. */
    retire: (kind: "spaces" | "floors" | "sites", id: string) => Promise<void>;
    /** An e-mail to a person of the network that a crash left neither sent nor failed. */
    uncertainMail: () => Promise<string>;
    cookie: (caller: CallerName) => Promise<string>;
  };
}

export async function seedWorld(app: TestApp): Promise<World> {
  const { db } = app.deps;
  const passwordHash = await hashPassword(worldPassword);
  const networkId = (await insertNetwork(db)).id;
  const siteA = (await insertSite(db, networkId)).id;
  const siteB = (await insertSite(db, networkId)).id;
  await ensureDefaultChecklists(db, networkId);

  const callers = {} as World["callers"];
  for (const name of callerNames) {
    const { role, atA } = callerGrants[name];
    const user = await insertUser(db, networkId);
    await db.update(users).set({ passwordHash }).where(eq(users.id, user.id));
    const siteId = atA ? siteA : null;
    await insertGrant(db, user.id, role, siteId);
    callers[name] = { id: user.id, email: user.email, grants: [{ role, siteId }] };
  }
  const cookie = (caller: CallerName) => sessionCookieFor(callers[caller].id, app);

  // The floor, its plan and scale go in over HTTP, as an administrator would.
  const floor = await insertFloor(db, siteA);
  const planPng = await pngPlan(400, 300);
  const admin = await cookie("administrator @A");
  const plan = await api(app.app, { cookie: admin })
    .put(`/api/floors/${floor.id}/plan`)
    .attach("plan", planPng, "plan.png");
  if (plan.status !== 200)
    throw new Error(`plan upload: ${plan.status} ${JSON.stringify(plan.body)}`);
  const space = await insertSpace(db, floor);

  const imageA = (
    await storeImage(app.deps, { siteId: siteA, uploadedBy: null, buffer: planPng, field: "photo" })
  ).id;

  let colour = 0;
  const jpeg = () =>
    jpegWithGps({
      width: 64,
      height: 48,
      colour: `#${(colour++ * 7919 + 0x123456).toString(16).slice(-6).padStart(6, "0")}`,
    });

  const freshSpace = () => insertSpace(db, floor);
  const auditorA = callers["auditor @A"].id;

  async function auditWithItem(status: "draft" | "submitted") {
    const fresh = await freshSpace();
    const { auditId } = await answeredDraftAudit(app.deps, {
      networkId,
      space: fresh,
      auditorId: auditorA,
      fail: [],
    });
    const [version] = await db
      .select({ id: checklistVersions.id })
      .from(checklistVersions)
      .where(
        and(
          eq(checklistVersions.networkId, networkId),
          eq(checklistVersions.zoneType, fresh.zoneType),
        ),
      );
    const [item] = await db
      .select({ id: checklistItems.id })
      .from(checklistItems)
      .where(eq(checklistItems.versionId, version!.id))
      .limit(1);
    if (status === "submitted") {
      const submitted = await api(app.app, { cookie: await cookie("auditor @A") }).post(
        `/api/audits/${auditId}/submit`,
      );
      if (submitted.status !== 200) throw new Error(`submit: ${submitted.status}`);
    }
    return { auditId, itemId: item!.id };
  }

  async function freshAction(state: ActionState, withProof = false) {
    const target = await freshSpace();
    const now = new Date();
    const [action] = await db
      .insert(correctiveActions)
      .values({
        siteId: siteA,
        spaceId: target.id,
        floorId: floor.id,
        itemKey: "robust-item",
        title: "Dirty chair labelled",
        severity: "major",
        state,
        assigneeId: callers["facilities lead @A"].id,
        openedAt: now,
        dueAt: new Date(now.getTime() + 7 * 24 * 3600 * 1000),
        closedAt: state === "done" ? now : null,
        x: 150,
        y: 150,
      })
      .returning();
    if (withProof)
      await db
        .insert(actionProofs)
        .values({ actionId: action!.id, imageId: imageA, round: 0, uploadedBy: null });
    return action!.id;
  }

  async function freshPerson(state: "active" | "invited" | "deactivated" = "active") {
    const person = await insertUser(db, networkId, {
      deactivatedAt: state === "deactivated" ? new Date() : null,
    });
    if (state !== "invited")
      await db.update(users).set({ passwordHash }).where(eq(users.id, person.id));
    const grant = await insertGrant(db, person.id, "auditor", siteA);
    if (state === "invited") await issueTestLink(person.id, "invitation", app);
    return { id: person.id, email: person.email, grantId: grant.id };
  }

  // History: a submitted audit with a failing item, through the real submit (findings, actions).
  const failing = await freshSpace();
  const { auditId: submittedAudit } = await answeredDraftAudit(app.deps, {
    networkId,
    space: failing,
    auditorId: auditorA,
    fail: [],
  });
  await api(app.app, { cookie: await cookie("auditor @A") }).post(
    `/api/audits/${submittedAudit}/submit`,
  );
  const draftAudit = (await auditWithItem("draft")).auditId;
  for (const state of actionStates) await freshAction(state, state !== "to_fix");
  const invitedPerson = (await freshPerson("invited")).id;
  await freshPerson("deactivated");
  await db
    .insert(fixtures)
    .values({ spaceId: space.id, siteId: siteA, kind: "dirty_chair", x: 150, y: 150 });

  return {
    app,
    networkId,
    siteA,
    siteB,
    floorA: floor.id,
    spaceA: space.id,
    imageA,
    planPng,
    passwordHash,
    callers,
    submittedAudit,
    draftAudit,
    invitedPerson,
    fresh: {
      space: freshSpace,
      async fixture() {
        const target = await freshSpace();
        const [row] = await db
          .insert(fixtures)
          .values({ spaceId: target.id, siteId: siteA, kind: "dirty_chair", x: 150, y: 150 })
          .returning();
        return row!;
      },
      person: freshPerson,
      action: freshAction,
      draftAudit: () => auditWithItem("draft"),
      submittedAudit: () => auditWithItem("submitted"),
      link: (userId, purpose) => issueTestLink(userId, purpose, app),
      async checklistDraft(zoneType) {
        await saveDraft(
          db,
          networkId,
          zoneType,
          {
            title: "Robust draft",
            items: [
              { text: "Door closes", severity: "major", response: "check", photoOnFail: false },
            ],
          },
          { userId: null, requestId: null },
        );
      },
      jpeg,
      async floor() {
        const made = await insertFloor(db, siteA);
        await insertSpace(db, made);
        return made;
      },
      async site() {
        const made = await insertSite(db, networkId);
        await insertSpace(db, await insertFloor(db, made.id));
        return made;
      },
      async retire(kind, id) {
        const response = await api(app.app, { cookie: await cookie("administrator (network)") })
          .post(`/api/${kind}/${id}/retire`)
          .send({});
        if (response.status !== 200)
          throw new Error(`retire ${kind}: ${response.status} ${JSON.stringify(response.body)}`);
      },
      async uncertainMail() {
        const person = await freshPerson();
        const [row] = await db
          .insert(outbox)
          .values({
            topic: "action_assigned",
            recipient: person.email,
            subject: "A corrective action is yours",
            textBody: "Open Lintel to see it.",
            status: "uncertain",
            attempts: 1,
          })
          .returning({ id: outbox.id });
        return row!.id;
      },
      cookie,
    },
  };
}

export const newId = () => randomUUID();
