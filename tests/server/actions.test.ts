import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import type { ActionDetail, ActionSummary } from "@shared/schemas/actions";

import {
  changeLog,
  correctiveActions,
  findings,
  outbox,
  roleGrants,
} from "../../server/db/schema/index";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { readExport } from "../helpers/csv";

const hour = 3_600_000;

/** The wall-clock date and time at an instant in a zone, as the site's clock shows it. */
function wallClock(date: Date, timeZone: string) {
  const parts = new Intl.DateTimeFormat("en-CA", {
    timeZone,
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
  }).formatToParts(date);
  const get = (type: string) => parts.find((part) => part.type === type)!.value;
  return {
    date: `${get("year")}-${get("month")}-${get("day")}`,
    time: `${get("hour")}:${get("minute")}`,
  };
}

describe("corrective actions", () => {
  const timeZone = "America/New_York";
  let networkId = "";
  let siteId = "";
  let otherSiteId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let auditor: SignedInPerson;
  let lead: SignedInPerson;
  let secondLead: SignedInPerson;
  let otherLead: SignedInPerson;
  let admin: SignedInPerson;
  let committee: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId, { timeZone })).id;
    otherSiteId = (await insertSite(db, networkId)).id;
    floor = await insertFloor(db, siteId);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
    secondLead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
    otherLead = await signInAs(networkId, [{ role: "facilities_lead", siteId: otherSiteId }]);
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  /** Submits an audit of the space over HTTP with the named items failing. */
  async function submitWithFailures(
    space: Awaited<ReturnType<typeof insertSpace>>,
    fail: string[],
  ) {
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail,
    });
    const response = await as(auditor).post(`/api/audits/${auditId}/submit`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return { auditId, submittedAt: new Date(response.body.audit.submittedAt as string) };
  }

  async function actionsOf(spaceId: string): Promise<ActionSummary[]> {
    const response = await as(auditor).get(`/api/sites/${siteId}/actions?spaceId=${spaceId}`);
    expect(response.status).toBe(200);
    return response.body.actions;
  }

  async function proof(actionId: string, person = lead) {
    return as(person)
      .post(`/api/actions/${actionId}/proofs`)
      .field("id", crypto.randomUUID())
      .attach(
        "photo",
        await jpegWithGps({ colour: `#${crypto.randomUUID().slice(0, 6)}` }),
        "fix.jpg",
      );
  }

  /** An action the lead has sent for a check, with proof and a note. */
  async function sentForCheck(fail = "Spare clean gloves") {
    const space = await insertSpace(testApp().deps.db, floor);
    await submitWithFailures(space, [fail]);
    const [action] = await actionsOf(space.id);
    expect((await as(lead).post(`/api/actions/${action!.id}/start`)).status).toBe(200);
    expect((await proof(action!.id)).status).toBe(201);
    const sent = await as(lead)
      .post(`/api/actions/${action!.id}/ask-check`)
      .send({ note: "Glove boxes in three sizes mounted by the door" });
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    return { space, actionId: action!.id };
  }

  it("when a critical item fails, then an action opens for the site's facilities lead, due 24 hours after the submit", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    const { auditId, submittedAt } = await submitWithFailures(space, [
      "Dirty chair present and labelled as dirty",
      "Spare clean gloves in several sizes",
    ]);

    const list = await actionsOf(space.id);
    expect(list).toHaveLength(2);
    const critical = list.find((action) => action.severity === "critical")!;
    expect(critical).toMatchObject({
      state: "to_fix",
      title: "Dirty chair present and labelled as dirty",
      assignee: { id: lead.user.id },
      overdue: false,
      findingCount: 1,
      siteTimeZone: timeZone,
      // Centre of the 200 × 100 rectangle at (100,100)–(300,200).
      position: { x: 200, y: 150 },
    });
    // Critical: 24 elapsed hours (the site policy's default, common practice).
    expect(new Date(critical.dueAt).getTime() - submittedAt.getTime()).toBe(24 * hour);

    // Major: 7 calendar days at the same time of day on the site's own clock (New York).
    const major = list.find((action) => action.severity === "major")!;
    const opened = wallClock(submittedAt, timeZone);
    const due = wallClock(new Date(major.dueAt), timeZone);
    expect(due.time).toBe(opened.time);
    const days =
      (Date.parse(`${due.date}T00:00:00Z`) - Date.parse(`${opened.date}T00:00:00Z`)) / (24 * hour);
    expect(days).toBe(7);

    const detail = (await as(lead).get(`/api/actions/${critical.id}`)).body as ActionDetail;
    expect(detail.findings).toHaveLength(1);
    expect(detail.findings[0]).toMatchObject({
      auditId,
      note: "Found at audit: Dirty chair present and labelled as dirty",
    });
    expect(detail.findings[0]!.photos).toHaveLength(1);
    expect(detail.timeline.map((entry) => entry.kind)).toEqual(["opened"]);
    expect(detail.timeline[0]!.actorName).toBe(auditor.user.displayName);

    // The owner is told, in the same commit as the submit.
    const mails = await testApp()
      .deps.db.select()
      .from(outbox)
      .where(and(eq(outbox.recipient, lead.user.email), eq(outbox.topic, "action_assigned")));
    expect(mails.length).toBeGreaterThanOrEqual(2);
    expect(mails.some((mail) => mail.textBody?.includes(`/actions/${critical.id}`))).toBe(true);
  });

  it("when the same item fails again while its action is open, then the finding joins that action", async () => {
    const { db } = testApp().deps;
    const space = await insertSpace(db, floor);
    await submitWithFailures(space, ["Bins not filled past three-quarters"]);
    await submitWithFailures(space, ["Bins not filled past three-quarters"]);
    const list = await actionsOf(space.id);
    expect(list).toHaveLength(1);
    expect(list[0]).toMatchObject({ severity: "minor", findingCount: 2 });
    const [rows] = await db
      .select({ n: count() })
      .from(findings)
      .where(eq(findings.spaceId, space.id));
    expect(rows!.n).toBe(2);
    const detail = (await as(auditor).get(`/api/actions/${list[0]!.id}`)).body as ActionDetail;
    expect(detail.timeline.map((entry) => entry.kind)).toEqual(["opened", "finding_added"]);
  });

  it("when two audits of one space with the same failure are submitted at once, then one action follows both", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    const drafts = await Promise.all(
      [0, 1].map(() =>
        answeredDraftAudit(testApp().deps, {
          networkId,
          space,
          auditorId: auditor.user.id,
          fail: ["Disinfectant wipes available"],
        }),
      ),
    );
    const replies = await Promise.all(
      drafts.map(({ auditId }) => as(auditor).post(`/api/audits/${auditId}/submit`)),
    );
    expect(replies.map((reply) => reply.status)).toEqual([200, 200]);
    const list = await actionsOf(space.id);
    expect(list).toHaveLength(1);
    expect(list[0]!.findingCount).toBe(2);
  });

  it("when a facilities lead of another site asks, then the action does not exist for them and cannot be moved", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    await submitWithFailures(space, ["Waste bins hands-free and lidded"]);
    const [action] = await actionsOf(space.id);
    const id = action!.id;
    expect((await as(otherLead).get(`/api/actions/${id}`)).status).toBe(404);
    expect((await as(otherLead).post(`/api/actions/${id}/start`)).status).toBe(404);
    expect((await proof(id, otherLead)).status).toBe(404);
    expect(
      (await as(otherLead).post(`/api/actions/${id}/ask-check`).send({ note: "done" })).status,
    ).toBe(404);
    expect((await as(otherLead).get(`/api/sites/${siteId}/actions`)).status).toBe(404);
    expect((await as(otherLead).get(`/api/my/actions`)).body.actions).toEqual([]);
    const [row] = await testApp()
      .deps.db.select()
      .from(correctiveActions)
      .where(eq(correctiveActions.id, id));
    expect(row!.state).toBe("to_fix");
  });

  it("when the lead asks for a check without a photo of the fix, then 400 names the proof and nothing changes", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    await submitWithFailures(space, ["Removal order displayed at eye level"]);
    const [action] = await actionsOf(space.id);
    const id = action!.id;
    // Sending straight from open is refused: the work has to start first.
    const early = await as(lead).post(`/api/actions/${id}/ask-check`).send({ note: "done" });
    expect(early.status).toBe(409);
    await as(lead).post(`/api/actions/${id}/start`);

    const noNote = await as(lead).post(`/api/actions/${id}/ask-check`).send({ note: " " });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.fields).toHaveProperty("note");

    const noProof = await as(lead)
      .post(`/api/actions/${id}/ask-check`)
      .send({ note: "Poster put back at eye level" });
    expect(noProof.status).toBe(400);
    expect(noProof.body.error.fields).toHaveProperty("proof");
    expect((await as(lead).get(`/api/actions/${id}`)).body.action.state).toBe("fixing");

    // A file that is not a picture is refused by name, and loses nothing.
    const notImage = await as(lead)
      .post(`/api/actions/${id}/proofs`)
      .field("id", crypto.randomUUID())
      .attach("photo", Buffer.from("not a picture"), "fix.txt");
    expect(notImage.status).toBe(415);

    expect((await proof(id)).status).toBe(201);
    const sent = await as(lead)
      .post(`/api/actions/${id}/ask-check`)
      .send({ note: "Poster put back at eye level" });
    expect(sent.status).toBe(200);
    const detail = sent.body as ActionDetail;
    expect(detail.action.state).toBe("to_check");
    expect(detail.proofs).toHaveLength(1);
    expect(detail.proofs[0]).toMatchObject({ current: true, uploadedBy: lead.user.displayName });
    expect(detail.timeline.at(-1)).toMatchObject({
      kind: "check_asked",
      actorName: lead.user.displayName,
      fromState: "fixing",
      toState: "to_check",
      text: "Poster put back at eye level",
    });
    // The site's auditors are asked to verify.
    const asked = await testApp()
      .deps.db.select()
      .from(outbox)
      .where(and(eq(outbox.recipient, auditor.user.email), eq(outbox.topic, "action_to_check")));
    expect(asked.some((mail) => mail.textBody?.includes(`/actions/${id}`))).toBe(true);
  });

  it("when anyone but an auditor tries to confirm the fix, then 403; the auditor's confirmation makes it done with days to close", async () => {
    const { actionId } = await sentForCheck();
    for (const person of [lead, admin, committee]) {
      const response = await as(person)
        .post(`/api/actions/${actionId}/confirm`)
        .send({ note: "ok" });
      expect(response.status).toBe(403);
    }
    expect((await as(auditor).post(`/api/actions/${actionId}/confirm`).send({})).status).toBe(400);
    const verified = await as(auditor)
      .post(`/api/actions/${actionId}/confirm`)
      .send({ note: "Gloves in place in three sizes" });
    expect(verified.status).toBe(200);
    const detail = verified.body as ActionDetail;
    expect(detail.action).toMatchObject({ state: "done", overdue: false });
    expect(detail.action.closedAt).not.toBeNull();
    expect(detail.action.daysToClose).toBe(0);
    expect(detail.timeline.map((entry) => entry.kind)).toEqual([
      "opened",
      "started",
      "proof_added",
      "check_asked",
      "fix_confirmed",
    ]);
    // Verifying twice is a conflict, not a second close.
    const again = await as(auditor)
      .post(`/api/actions/${actionId}/confirm`)
      .send({ note: "again" });
    expect(again.status).toBe(409);
  });

  it("when the auditor sends the fix back, then it is being fixed again and needs a new photo", async () => {
    const { actionId } = await sentForCheck("Mirror or observer position");
    const rejected = await as(auditor)
      .post(`/api/actions/${actionId}/send-back`)
      .send({ reason: "The mirror is behind the door" });
    expect(rejected.status).toBe(200);
    expect(rejected.body.action.state).toBe("fixing");
    expect(rejected.body.proofs[0].current).toBe(false);
    const resend = await as(lead)
      .post(`/api/actions/${actionId}/ask-check`)
      .send({ note: "Same photo again" });
    expect(resend.status).toBe(400);
    expect(resend.body.error.fields).toHaveProperty("proof");
    expect((await proof(actionId)).status).toBe(201);
    expect(
      (
        await as(lead)
          .post(`/api/actions/${actionId}/ask-check`)
          .send({ note: "Mirror moved beside the dirty chair" })
      ).status,
    ).toBe(200);
  });

  it("when an auditor reopens a done action, then it is being fixed again with its history and original due time", async () => {
    const { actionId } = await sentForCheck("Clean chair for the last steps");
    await as(auditor).post(`/api/actions/${actionId}/confirm`).send({ note: "Chair in place" });
    const before = (await as(auditor).get(`/api/actions/${actionId}`)).body as ActionDetail;

    expect(
      (await as(lead).post(`/api/actions/${actionId}/reopen`).send({ reason: "It moved again" }))
        .status,
    ).toBe(403);
    const short = await as(auditor).post(`/api/actions/${actionId}/reopen`).send({ reason: "no" });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty("reason");

    const reopened = await as(auditor)
      .post(`/api/actions/${actionId}/reopen`)
      .send({ reason: "The chair is back on the dirty side" });
    expect(reopened.status).toBe(200);
    const detail = reopened.body as ActionDetail;
    expect(detail.action).toMatchObject({
      state: "fixing",
      dueAt: before.action.dueAt,
      closedAt: null,
      daysToClose: null,
    });
    expect(detail.timeline.map((entry) => entry.kind)).toEqual([
      "opened",
      "started",
      "proof_added",
      "check_asked",
      "fix_confirmed",
      "reopened",
    ]);
    expect(detail.timeline.at(-1)).toMatchObject({
      actorName: auditor.user.displayName,
      text: "The chair is back on the dirty side",
      fromState: "done",
      toState: "fixing",
    });
    // Every move is in the append-only change log with who and why.
    const logged = await testApp()
      .deps.db.select()
      .from(changeLog)
      .where(and(eq(changeLog.entity, "corrective_action"), eq(changeLog.entityId, actionId)));
    expect(logged).toHaveLength(6);
    expect(logged.every((row) => row.actorId !== null)).toBe(true);
  });

  it("when a done action's item has a newer unfinished action, then reopening is refused as a twin", async () => {
    const { space, actionId } = await sentForCheck("No clean supplies stored");
    await as(auditor).post(`/api/actions/${actionId}/confirm`).send({ note: "Cleared" });
    await submitWithFailures(space, ["No clean supplies stored in the doffing area"]);
    expect(await actionsOf(space.id)).toHaveLength(2);
    const reopened = await as(auditor)
      .post(`/api/actions/${actionId}/reopen`)
      .send({ reason: "Supplies are back" });
    expect(reopened.status).toBe(409);
  });

  it("when an action is given to someone, then only an active facilities lead of the site can take it", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    await submitWithFailures(space, ["Floor clear and dry"]);
    const [action] = await actionsOf(space.id);
    const options = await as(admin).get(`/api/sites/${siteId}/action-assignees`);
    expect(options.body.people.map((p: { id: string }) => p.id)).toEqual(
      expect.arrayContaining([lead.user.id, secondLead.user.id]),
    );
    const wrong = await as(admin)
      .put(`/api/actions/${action!.id}/assignee`)
      .send({ assigneeId: otherLead.user.id });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toHaveProperty("assigneeId");
    const handed = await as(lead)
      .put(`/api/actions/${action!.id}/assignee`)
      .send({ assigneeId: secondLead.user.id });
    expect(handed.status).toBe(200);
    expect(handed.body.action.assignee).toEqual({
      id: secondLead.user.id,
      name: secondLead.user.displayName,
    });
    expect(handed.body.timeline.at(-1)).toMatchObject({
      kind: "assigned",
      actorName: lead.user.displayName,
      text: `Now owned by ${secondLead.user.displayName}.`,
    });
    const mine = await as(secondLead).get("/api/my/actions");
    expect(mine.body.actions.map((a: ActionSummary) => a.id)).toContain(action!.id);
  });

  it("when the site has no facilities lead, then the action opens without an owner and no e-mail", async () => {
    const { db } = testApp().deps;
    const lonelySite = await insertSite(db, networkId);
    const lonelyAuditor = await signInAs(networkId, [{ role: "auditor", siteId: lonelySite.id }]);
    const space = await insertSpace(db, await insertFloor(db, lonelySite.id));
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: lonelyAuditor.user.id,
      fail: ["Spare clean gloves in several sizes"],
    });
    expect((await as(lonelyAuditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const [action] = await db
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(action!.assigneeId).toBeNull();
    const mails = await db.select({ text: outbox.textBody }).from(outbox);
    expect(mails.some((mail) => mail.text?.includes(`/actions/${action!.id}`))).toBe(false);
  });

  it("when an administrator changes the site's due times, then new actions use them and bad values are named", async () => {
    const { db } = testApp().deps;
    const policySite = await insertSite(db, networkId, { timeZone: "Europe/London" });
    await db
      .insert(roleGrants)
      .values({ userId: auditor.user.id, role: "auditor", siteId: policySite.id });
    const initial = await as(auditor).get(`/api/sites/${policySite.id}/due-policy`);
    expect(initial.body).toEqual({
      isDefault: true,
      policy: {
        critical: { amount: 24, unit: "hours" },
        major: { amount: 7, unit: "days" },
        minor: { amount: 30, unit: "days" },
      },
    });
    const bad = await as(admin)
      .put(`/api/sites/${policySite.id}/due-policy`)
      .send({
        critical: { amount: 0, unit: "hours" },
        major: { amount: 7, unit: "weeks" },
        minor: { amount: 400, unit: "days" },
      });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(
      expect.arrayContaining(["critical.amount", "major.unit", "minor.amount"]),
    );
    expect((await as(auditor).get(`/api/sites/${policySite.id}/due-policy`)).body.isDefault).toBe(
      true,
    );

    const saved = await as(admin)
      .put(`/api/sites/${policySite.id}/due-policy`)
      .send({
        critical: { amount: 4, unit: "hours" },
        major: { amount: 3, unit: "days" },
        minor: { amount: 14, unit: "days" },
      });
    expect(saved.status).toBe(200);
    expect(saved.body.isDefault).toBe(false);

    const space = await insertSpace(db, await insertFloor(db, policySite.id));
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: ["Hand rub within reach of every removal step"],
    });
    const submitted = await as(auditor).post(`/api/audits/${auditId}/submit`);
    const [action] = await db
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(action!.dueAt.getTime() - new Date(submitted.body.audit.submittedAt).getTime()).toBe(
      4 * hour,
    );
  });

  it("when an action is past due, then it is marked overdue and comes first, in the list and in my actions", async () => {
    const { db } = testApp().deps;
    const space = await insertSpace(db, floor);
    await submitWithFailures(space, ["Hand-rub dispensers at least 48 in"]);
    const [late] = await actionsOf(space.id);
    await db
      .update(correctiveActions)
      .set({
        dueAt: new Date(Date.now() - 3 * 24 * hour),
        openedAt: new Date(Date.now() - 40 * 24 * hour),
      })
      .where(eq(correctiveActions.id, late!.id));

    const overdueOnly = await as(committee).get(`/api/sites/${siteId}/actions?overdue=true`);
    expect(overdueOnly.status).toBe(200);
    expect(overdueOnly.body.actions.map((a: ActionSummary) => a.id)).toContain(late!.id);
    expect(overdueOnly.body.actions.every((a: ActionSummary) => a.overdue)).toBe(true);

    const mine = (await as(lead).get("/api/my/actions")).body.actions as ActionSummary[];
    expect(mine[0]!.overdue).toBe(true);
    const firstNotOverdue = mine.findIndex((a) => !a.overdue);
    const lastOverdue = mine.map((a) => a.overdue).lastIndexOf(true);
    if (firstNotOverdue >= 0) expect(lastOverdue).toBeLessThan(firstNotOverdue);
    const dues = mine.filter((a) => !a.overdue).map((a) => a.dueAt);
    expect(dues).toEqual([...dues].sort());
  });

  it("when the list is exported, then the CSV has a header, one row per action with formula-like text defused and severity and state in words, and the caution last", async () => {
    const { db } = testApp().deps;
    const space = await insertSpace(db, floor);
    await submitWithFailures(space, ["Spare clean gloves in several sizes"]);
    const [action] = await actionsOf(space.id);
    await db
      .update(correctiveActions)
      .set({ title: '=HYPERLINK("x")' })
      .where(eq(correctiveActions.id, action!.id));
    const response = await as(committee).get(
      `/api/sites/${siteId}/actions/export?spaceId=${space.id}`,
    );
    expect(response.status).toBe(200);
    expect(response.headers["content-type"]).toMatch(/^text\/csv/);
    expect(response.headers["content-disposition"]).toMatch(
      /^attachment; filename="?corrective-actions-\d{4}-\d{2}-\d{2}\.csv/,
    );
    const lines = response.text.replace(/^\uFEFF/, "").split("\n");
    expect(lines[0]).toBe(
      "id,site,floor,space,zone type,item,severity,state,owner,opened (UTC),due (UTC),due (site time),overdue,done (UTC),days to close,findings,link",
    );
    expect(lines[1]).toContain(`"'=HYPERLINK(""x"")"`);
    const { rows, objects } = readExport(response.text);
    expect(rows).toHaveLength(1);
    expect(objects[0]).toMatchObject({
      id: action!.id,
      item: `'=HYPERLINK("x")`,
      severity: { critical: "Critical", major: "Major", minor: "Minor" }[action!.severity],
      state: "To fix",
      link: `http://lintel.test/actions/${action!.id}`,
    });
  });

  it("when an administrator amends a passed answer to failed, then the finding opens an action; amending it back leaves the action for an auditor to close", async () => {
    const space = await insertSpace(testApp().deps.db, floor);
    const { auditId } = await submitWithFailures(space, []);
    expect(await actionsOf(space.id)).toHaveLength(0);
    const detail = (await as(admin).get(`/api/audits/${auditId}`)).body;
    const wipes = detail.items.find((i: { text: string }) =>
      i.text.startsWith("Disinfectant wipes"),
    );
    const amended = await as(admin).post(`/api/audits/${auditId}/amendments`).send({
      itemId: wipes.id,
      outcome: "fail",
      note: "No wipes",
      reason: "Entered as pass by mistake",
    });
    expect(amended.status).toBe(200);
    const [action] = await actionsOf(space.id);
    expect(action).toMatchObject({ state: "to_fix", severity: "major", findingCount: 1 });
    await as(admin)
      .post(`/api/audits/${auditId}/amendments`)
      .send({ itemId: wipes.id, outcome: "pass", reason: "Wipes were there after all" });
    expect((await actionsOf(space.id))[0]).toMatchObject({ id: action!.id, state: "to_fix" });
  });

  it("when an action's address carries a broken id, then 400 names the field in plain words", async () => {
    const response = await as(auditor).get("/api/actions/not-an-id");
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({
      actionId: "This does not point to anything in Lintel; choose it again from the list.",
    });
  });

  it("when the list filter is unknown, then 400 names the field", async () => {
    const response = await as(auditor).get(`/api/sites/${siteId}/actions?state=sometimes`);
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty("state");
  });
});
