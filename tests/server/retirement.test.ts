import { randomUUID } from "node:crypto";

import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import type { ActionDetail } from "@shared/schemas/actions";

import {
  auditAnswers,
  audits,
  changeLog,
  correctiveActions,
  findings,
  outbox,
  sites,
  spaces,
} from "../../server/db/schema/index";
import { appErrorFromDatabase } from "../../server/lib/database-errors";
import { answerEveryItem, answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

type Space = Awaited<ReturnType<typeof insertSpace>>;

describe("retired versus deleted", () => {
  let networkId = "";
  let siteId = "";
  let admin: SignedInPerson;
  let networkAdmin: SignedInPerson;
  let auditor: SignedInPerson;
  let lead: SignedInPerson;
  let committee: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId }]);
    networkAdmin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
  const db = () => testApp().deps.db;
  const month = () => new Date().toISOString().slice(0, 7);

  /** Submits an audit of the space over HTTP with the named items failing. */
  async function submitted(space: Space, fail: string[] = []) {
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail,
    });
    const response = await as(auditor).post(`/api/audits/${auditId}/submit`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return auditId;
  }

  async function rowsOf(spaceId: string) {
    const [[a], [f], [c], [answers]] = await Promise.all([
      db().select({ n: count() }).from(audits).where(eq(audits.spaceId, spaceId)),
      db().select({ n: count() }).from(findings).where(eq(findings.spaceId, spaceId)),
      db()
        .select({ n: count() })
        .from(correctiveActions)
        .where(eq(correctiveActions.spaceId, spaceId)),
      db()
        .select({ n: count() })
        .from(auditAnswers)
        .innerJoin(audits, eq(audits.id, auditAnswers.auditId))
        .where(eq(audits.spaceId, spaceId)),
    ]);
    return { audits: a!.n, findings: f!.n, actions: c!.n, answers: answers!.n };
  }

  async function action(actionId: string): Promise<ActionDetail> {
    const response = await as(auditor).get(`/api/actions/${actionId}`);
    expect(response.status).toBe(200);
    return response.body;
  }

  async function actionIdsOf(spaceId: string) {
    const rows = await db()
      .select({ id: correctiveActions.id })
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, spaceId));
    return rows.map((row) => row.id);
  }

  it("when a space with a submitted audit is deleted, then it answers 409 naming its history and the audit, answers, findings and actions all stay", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    await submitted(space, ["Disinfectant wipes available"]);
    const before = await rowsOf(space.id);
    expect(before).toMatchObject({ audits: 1, findings: 1, actions: 1 });

    const response = await as(admin).delete(`/api/spaces/${space.id}`);
    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/has history \(1 audit and 1 corrective action\)/);
    expect(response.body.error.message).toMatch(/Retire it instead/);
    expect(await rowsOf(space.id)).toEqual(before);
    const [row] = await db().select().from(spaces).where(eq(spaces.id, space.id));
    expect(row?.retiredAt).toBeNull();
  });

  it("when a space has only a draft audit, then it counts as history too and is not deleted", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: [],
    });
    expect((await as(admin).delete(`/api/spaces/${space.id}`)).status).toBe(409);
    expect((await rowsOf(space.id)).audits).toBe(1);
  });

  it("when a space with no history is deleted, then it is gone and the change log says so", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    expect((await as(admin).delete(`/api/spaces/${space.id}`)).status).toBe(204);
    expect(await db().select().from(spaces).where(eq(spaces.id, space.id))).toEqual([]);
    const logged = await db()
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entityId, space.id), eq(changeLog.action, "space.deleted")));
    expect(logged).toHaveLength(1);
  });

  it("when a floor with no history is deleted, then it goes; one whose space has an audit answers 409", async () => {
    const empty = await insertFloor(db(), siteId);
    await insertSpace(db(), empty);
    expect((await as(admin).delete(`/api/floors/${empty.id}`)).status).toBe(204);
    expect((await as(admin).get(`/api/floors/${empty.id}`)).status).toBe(404);

    const used = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), used);
    await submitted(space);
    const refused = await as(admin).delete(`/api/floors/${used.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/Retire it instead/);
    expect((await rowsOf(space.id)).audits).toBe(1);
  });

  it("when the database itself is asked to delete a space, floor or site with history, then it refuses and the one mapping answers 409", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    await submitted(space, ["Disinfectant wipes available"]);
    for (const attempt of [
      () => db().delete(spaces).where(eq(spaces.id, space.id)),
      () => db().execute(`delete from floors where id = '${floor.id}'`),
      () => db().delete(sites).where(eq(sites.id, siteId)),
    ]) {
      const error = await attempt().then(
        () => null,
        (err: unknown) => err,
      );
      expect(error, "the delete should have been refused").not.toBeNull();
      const mapped = appErrorFromDatabase(error);
      expect(mapped?.status).toBe(409);
      expect(mapped?.message).toMatch(/history/);
    }
    expect(await rowsOf(space.id)).toMatchObject({ audits: 1, findings: 1, actions: 1 });
  });

  it("when a space is retired, then it leaves the map, the due list and new audits, but its history, exports and committee figures keep it", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    const kept = await insertSpace(db(), floor);
    const auditId = await submitted(space);
    const figures = async () =>
      (
        await as(committee).get(`/api/committee/comparison?from=${month()}&to=${month()}`)
      ).body.sites.find((site: { siteId: string }) => site.siteId === siteId).verdicts;
    const before = await figures();

    const retired = await as(admin)
      .post(`/api/spaces/${space.id}/retire`)
      .send({ reason: "Ward converted to offices" });
    expect(retired.status, JSON.stringify(retired.body)).toBe(200);
    expect(retired.body.retirement).toMatchObject({
      kind: "space",
      id: space.id,
      spaces: 1,
      actions: 0,
    });

    const map = (await as(auditor).get(`/api/floors/${floor.id}`)).body;
    expect(map.spaces.map((s: { id: string }) => s.id)).toEqual([kept.id]);
    const due = (await as(auditor).get(`/api/sites/${siteId}/schedule`)).body;
    const dueIds = JSON.stringify(due);
    expect(dueIds).toContain(kept.id);
    expect(dueIds).not.toContain(space.id);
    expect(JSON.stringify((await as(auditor).get("/api/my/due")).body)).not.toContain(space.id);

    const refused = await as(auditor)
      .put(`/api/audits/${randomUUID()}`)
      .send({ spaceId: space.id, startedAt: new Date().toISOString() });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/retired/);

    const history = await as(auditor).get(`/api/spaces/${space.id}/audits`);
    expect(history.status).toBe(200);
    expect(history.body.audits).toEqual([
      expect.objectContaining({ id: auditId, spaceRetiredAt: retired.body.retirement.retiredAt }),
    ]);
    expect((await as(auditor).get(`/api/audits/${auditId}`)).status).toBe(200);
    expect(await figures()).toEqual(before);
    const exported = await as(committee).get(
      `/api/committee/audits/export?from=${month()}&to=${month()}`,
    );
    expect(exported.text).toContain(space.name);

    const listed = await as(admin).get(`/api/sites/${siteId}/retired`);
    expect(listed.body.spaces).toEqual([
      expect.objectContaining({ id: space.id, name: space.name, floorRetired: false }),
    ]);
    const [logged] = await db()
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entityId, space.id), eq(changeLog.action, "space.retired")));
    expect(logged?.reason).toBe("Ward converted to offices");
  });

  it("when a space with unfinished actions is retired, then they are done with the reason space retired, are not counted as fixed, and restore reopens them as they were", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    await submitted(space, ["Disinfectant wipes available", "Spare clean gloves in several sizes"]);
    const [first, second] = await actionIdsOf(space.id);
    expect((await as(lead).post(`/api/actions/${first}/start`)).status).toBe(200);

    const retired = await as(admin).post(`/api/spaces/${space.id}/retire`).send({});
    expect(retired.body.retirement.actions).toBe(2);
    for (const id of [first!, second!]) {
      const detail = await action(id);
      expect(detail.action).toMatchObject({
        state: "done",
        closeReason: "space_retired",
        daysToClose: null,
        spaceRetiredAt: retired.body.retirement.retiredAt,
      });
      expect(detail.timeline.at(-1)).toMatchObject({
        kind: "space_retired",
        toState: "done",
        text: expect.stringMatching(/space was retired/),
      });
    }
    const trends = await as(committee).get(`/api/committee/trends?from=${month()}&to=${month()}`);
    expect(
      trends.body.closeTimes.filter((row: { siteId: string }) => row.siteId === siteId),
    ).toEqual([]);
    const reopen = await as(auditor).post(`/api/actions/${first}/reopen`).send({ reason: "Again" });
    expect(reopen.status).toBe(409);
    expect(reopen.body.error.message).toMatch(/retired/);

    const restored = await as(admin).post(`/api/spaces/${space.id}/restore`).send({});
    expect(restored.status).toBe(200);
    expect(restored.body.retirement).toMatchObject({ retiredAt: null, spaces: 1, actions: 2 });
    expect((await action(first!)).action).toMatchObject({
      state: "fixing",
      closeReason: null,
      closedAt: null,
      spaceRetiredAt: null,
    });
    expect((await action(second!)).action).toMatchObject({ state: "to_fix", closeReason: null });
    expect((await action(first!)).timeline.at(-1)).toMatchObject({ kind: "space_restored" });
    const map = (await as(auditor).get(`/api/floors/${floor.id}`)).body;
    expect(map.spaces.map((s: { id: string }) => s.id)).toEqual([space.id]);
    const started = await as(auditor)
      .put(`/api/audits/${randomUUID()}`)
      .send({ spaceId: space.id, startedAt: new Date().toISOString() });
    expect(started.status).toBe(201);
  });

  it("when an audit started offline before the retirement arrives, then it is accepted and submitted, and what it found closes as space retired without e-mail", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    const startedOnPhone = new Date(Date.now() - 60_000).toISOString();
    expect((await as(admin).post(`/api/spaces/${space.id}/retire`).send({})).status).toBe(200);

    const auditId = randomUUID();
    const arrived = await as(auditor)
      .put(`/api/audits/${auditId}`)
      .send({ spaceId: space.id, startedAt: startedOnPhone });
    expect(arrived.status, JSON.stringify(arrived.body)).toBe(201);
    await answerEveryItem(testApp().deps, {
      auditId,
      checklistVersionId: arrived.body.audit.checklistVersionId,
      space,
      auditorId: auditor.user.id,
      fail: ["Disinfectant wipes available"],
    });
    const mailBefore = (await db().select({ n: count() }).from(outbox))[0]!.n;
    const submittedAudit = await as(auditor).post(`/api/audits/${auditId}/submit`);
    expect(submittedAudit.status, JSON.stringify(submittedAudit.body)).toBe(200);
    expect(submittedAudit.body.audit.status).toBe("submitted");
    const [actionId] = await actionIdsOf(space.id);
    expect((await action(actionId!)).action).toMatchObject({
      state: "done",
      closeReason: "space_retired",
    });
    expect((await db().select({ n: count() }).from(outbox))[0]!.n).toBe(mailBefore);

    const late = await as(auditor)
      .put(`/api/audits/${randomUUID()}`)
      .send({ spaceId: space.id, startedAt: new Date().toISOString() });
    expect(late.status).toBe(409);
  });

  it("when a floor is retired, then its spaces go with it, and restoring it brings back those and not a space retired before", async () => {
    const floor = await insertFloor(db(), siteId);
    const earlier = await insertSpace(db(), floor);
    const withFloor = await insertSpace(db(), floor);
    await submitted(withFloor);
    await as(admin).post(`/api/spaces/${earlier.id}/retire`).send({});

    const retired = await as(admin).post(`/api/floors/${floor.id}/retire`).send({});
    expect(retired.status).toBe(200);
    expect(retired.body.retirement).toMatchObject({ kind: "floor", floors: 1, spaces: 1 });
    const floorsNow = (await as(auditor).get(`/api/sites/${siteId}/floors`)).body.floors;
    expect(floorsNow.map((f: { id: string }) => f.id)).not.toContain(floor.id);
    expect((await as(auditor).get(`/api/floors/${floor.id}`)).body.spaces).toEqual([]);
    const listed = (await as(admin).get(`/api/sites/${siteId}/retired`)).body;
    expect(listed.floors.map((f: { id: string }) => f.id)).toContain(floor.id);
    expect(listed.spaces.find((s: { id: string }) => s.id === withFloor.id).floorRetired).toBe(
      true,
    );

    const alone = await as(admin).post(`/api/spaces/${withFloor.id}/restore`).send({});
    expect(alone.status).toBe(409);
    expect(alone.body.error.message).toMatch(/Restore the floor first/);
    const added = await as(admin)
      .post(`/api/floors/${floor.id}/spaces`)
      .send({
        zoneType: "anteroom",
        name: "New",
        polygon: [
          [0, 0],
          [10, 0],
          [10, 10],
        ],
      });
    expect(added.status).toBe(409);

    const restored = await as(admin).post(`/api/floors/${floor.id}/restore`).send({});
    expect(restored.body.retirement).toMatchObject({ floors: 1, spaces: 1 });
    const map = (await as(auditor).get(`/api/floors/${floor.id}`)).body;
    expect(map.spaces.map((s: { id: string }) => s.id)).toEqual([withFloor.id]);
    const [stillRetired] = await db().select().from(spaces).where(eq(spaces.id, earlier.id));
    expect(stillRetired?.retiredAt).not.toBeNull();
  });

  it("when a site is retired, then it leaves the site list with its floors and spaces, the committee still counts its audits, and restore brings back exactly what it hid", async () => {
    const { db: database } = testApp().deps;
    const otherSite = (await insertSite(database, networkId)).id;
    const siteAdmin = await signInAs(networkId, [{ role: "administrator", siteId: otherSite }]);
    const kept = await insertFloor(database, otherSite);
    const earlierFloor = await insertFloor(database, otherSite);
    const space = await insertSpace(database, kept);
    await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: networkAdmin.user.id,
      fail: [],
    }).then(({ auditId }) =>
      database
        .update(audits)
        .set({ status: "submitted", submittedAt: new Date(), verdict: "all_clear", score: 1 })
        .where(eq(audits.id, auditId)),
    );
    // Counted the way a submit counts it, so the figures include this site.
    const { rebuildMonthStats } =
      await import("../../server/modules/committee/committee.repository");
    await rebuildMonthStats(database, [otherSite]);
    await as(networkAdmin).post(`/api/floors/${earlierFloor.id}/retire`).send({});

    expect((await as(siteAdmin).post(`/api/sites/${otherSite}/retire`).send({})).status).toBe(403);
    const retired = await as(networkAdmin)
      .post(`/api/sites/${otherSite}/retire`)
      .send({ reason: "Hospital closed" });
    expect(retired.status, JSON.stringify(retired.body)).toBe(200);
    expect(retired.body.retirement).toMatchObject({ kind: "site", floors: 1, spaces: 1 });

    const list = (await as(networkAdmin).get("/api/sites")).body.sites;
    expect(list.map((s: { id: string }) => s.id)).not.toContain(otherSite);
    const retiredSites = (await as(networkAdmin).get("/api/retired-sites")).body.sites;
    expect(retiredSites).toEqual([expect.objectContaining({ id: otherSite })]);
    const comparison = await as(committee).get(
      `/api/committee/comparison?from=${month()}&to=${month()}`,
    );
    const row = comparison.body.sites.find((s: { siteId: string }) => s.siteId === otherSite);
    expect(row?.verdicts.all_clear).toBe(1);
    const floorAdded = await as(networkAdmin)
      .post(`/api/sites/${otherSite}/floors`)
      .send({ building: "B", level: 1, name: "Late" });
    expect(floorAdded.status).toBe(409);

    const restored = await as(networkAdmin).post(`/api/sites/${otherSite}/restore`).send({});
    expect(restored.body.retirement).toMatchObject({ floors: 1, spaces: 1, retiredAt: null });
    const floorsNow = (await as(networkAdmin).get(`/api/sites/${otherSite}/floors`)).body.floors;
    expect(floorsNow.map((f: { id: string }) => f.id)).toEqual([kept.id]);
    expect(
      (await as(networkAdmin).get("/api/sites")).body.sites.map((s: { id: string }) => s.id),
    ).toContain(otherSite);
  });

  it("when someone who is not an administrator of the site tries to retire, restore or delete, then it is refused and nothing changes", async () => {
    const floor = await insertFloor(db(), siteId);
    const space = await insertSpace(db(), floor);
    expect((await as(auditor).post(`/api/spaces/${space.id}/retire`).send({})).status).toBe(403);
    expect((await as(lead).post(`/api/floors/${floor.id}/retire`).send({})).status).toBe(403);
    expect((await as(auditor).delete(`/api/spaces/${space.id}`)).status).toBe(403);
    expect((await as(admin).post(`/api/sites/${siteId}/retire`).send({})).status).toBe(403);
    const bad = await as(admin).post(`/api/spaces/${space.id}/retire`).send({ reason: 7 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("reason");
    const [row] = await db().select().from(spaces).where(eq(spaces.id, space.id));
    expect(row?.retiredAt).toBeNull();
  });
});
