import { eq } from "drizzle-orm";
import { afterEach, beforeEach, describe, expect, it } from "vitest";

import type { ActionSummary } from "@shared/schemas/actions";

import { actionNotices, correctiveActions, outbox } from "../../server/db/schema/index";
import { createActionScheduler } from "../../server/modules/actions/actions.scheduler";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { createMailTestApp, linkIn, mailTo, type MailTestApp } from "../helpers/mail";

const hour = 3_600_000;
const day = 24 * hour;

describe("corrective action e-mail and notices", () => {
  let mail: MailTestApp;
  let networkId: string;
  let siteId: string;
  let space: Awaited<ReturnType<typeof insertSpace>>;
  let auditor: SignedInPerson;
  let secondAuditor: SignedInPerson;
  let lead: SignedInPerson;

  beforeEach(async () => {
    mail = await createMailTestApp();
    const { db } = mail.deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    space = await insertSpace(db, await insertFloor(db, siteId));
    const options = { app: mail };
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }], options);
    secondAuditor = await signInAs(networkId, [{ role: "auditor", siteId }], options);
    lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }], options);
  });
  afterEach(async () => {
    await mail.close();
  });

  const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });
  const scheduler = () =>
    createActionScheduler({
      db: mail.deps.db,
      env: mail.deps.env,
      logger: mail.deps.logger,
      intervalMs: 60_000,
      notifyOutbox: mail.deps.notifyOutbox,
    });

  async function failedAudit(fail: string) {
    const { auditId } = await answeredDraftAudit(mail.deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: [fail],
    });
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const list = await as(lead).get(
      `/api/sites/${siteId}/actions?spaceId=${space.id}&state=unfinished`,
    );
    return (list.body.actions as ActionSummary[]).find((action) => action.title.startsWith(fail))!;
  }

  const settle = () => new Promise((resolve) => setTimeout(resolve, 400));

  it("when the worker runs twice at once and SMTP is stopped and restarted in between, then each event's e-mail arrives exactly once", async () => {
    const second = mail.extraWorker();
    second.start();
    try {
      const action = await failedAudit("Spare clean gloves in several sizes");
      // Assignment: one e-mail to the owner.
      await mail.catcher.waitFor(() => mailTo(mail.catcher, lead.user.email).length >= 1);

      await mail.catcher.stop();
      await as(lead).post(`/api/actions/${action.id}/start`);
      await as(lead)
        .post(`/api/actions/${action.id}/proofs`)
        .field("id", crypto.randomUUID())
        .attach("photo", await jpegWithGps(), "fix.jpg");
      await as(lead)
        .post(`/api/actions/${action.id}/ask-check`)
        .send({ note: "Three glove sizes mounted by the door" });
      await as(auditor)
        .post(`/api/actions/${action.id}/send-back`)
        .send({ reason: "Only two sizes are there" });
      // Past due while SMTP is down: both schedulers run a round at the same moment.
      await mail.deps.db
        .update(correctiveActions)
        .set({ dueAt: new Date(Date.now() - hour) })
        .where(eq(correctiveActions.id, action.id));
      const [a, b] = await Promise.all([scheduler().tick(), scheduler().tick()]);
      expect(a + b).toBe(1);
      // Both workers have tried and failed while the server was down.
      await expect
        .poll(async () =>
          (await mail.deps.db.select().from(outbox)).some(
            (row) => row.status === "pending" && row.attempts > 0,
          ),
        )
        .toBe(true);
      expect(mail.catcher.messages).toHaveLength(1);

      await mail.catcher.start();
      await mail.catcher.waitFor((messages) => messages.length >= 5, 10_000);
      await settle();

      const received = mail.catcher.messages.map((m) => `${m.to.join(",")} | ${m.subject}`).sort();
      expect(received).toEqual(
        [
          `${lead.user.email} | Corrective action for you: ${space.name}`,
          `${auditor.user.email} | Fix to check: ${space.name}`,
          `${secondAuditor.user.email} | Fix to check: ${space.name}`,
          `${lead.user.email} | Fix sent back: ${space.name}`,
          `${lead.user.email} | Overdue: ${space.name}`,
        ].sort(),
      );
      const ids = mail.catcher.messages.map((m) => m.messageId);
      expect(new Set(ids).size).toBe(ids.length);
      // Each e-mail links to the action.
      for (const message of mail.catcher.messages) {
        expect(linkIn(message).pathname).toBe(`/actions/${action.id}`);
      }
      const rejection = mailTo(mail.catcher, lead.user.email).find((m) =>
        m.subject.startsWith("Fix sent back"),
      )!;
      expect(rejection.text).toContain("Only two sizes are there");
    } finally {
      await second.stop();
    }
  });

  it("when time passes, then due-soon, overdue and weekly reminders go out once each, and downtime sends only the latest", async () => {
    const action = await failedAudit("Waste bins hands-free and lidded");
    const [row] = await mail.deps.db
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.id, action.id));
    const due = row!.dueAt.getTime();
    const worker = scheduler();
    const at = (offset: number) => new Date(due + offset);

    expect(await worker.tick(at(-2 * day))).toBe(0);
    expect(await worker.tick(at(-20 * hour))).toBe(1); // due within a day
    expect(await worker.tick(at(-19 * hour))).toBe(0);
    expect(await worker.tick(at(hour))).toBe(1); // overdue, once
    expect(await worker.tick(at(2 * hour))).toBe(0);
    expect(await worker.tick(at(hour + 7 * day))).toBe(1); // a week after the overdue notice
    expect(await worker.tick(at(hour + 7 * day + 1))).toBe(0);
    // Down for a month: one reminder for where things stand, not four.
    expect(await worker.tick(at(hour + 35 * day))).toBe(1);
    expect(await worker.tick(at(hour + 36 * day))).toBe(0);

    const notices = await mail.deps.db
      .select({ kind: actionNotices.kind })
      .from(actionNotices)
      .where(eq(actionNotices.actionId, action.id));
    expect(notices.map((notice) => notice.kind).sort()).toEqual(
      ["due-soon", "overdue", "reminder-1", "reminder-5"].sort(),
    );
    await mail.catcher.waitFor(() => mailTo(mail.catcher, lead.user.email).length >= 5);
    await settle();
    const subjects = mailTo(mail.catcher, lead.user.email).map((m) => m.subject.split(":")[0]);
    expect(subjects.sort()).toEqual(
      [
        "Corrective action for you",
        "Due within a day",
        "Overdue",
        "Still overdue",
        "Still overdue",
      ].sort(),
    );
  });

  it("when an action's fix waits for its check or the action is done, then no time-based notice goes to the owner", async () => {
    const action = await failedAudit("Removal order displayed at eye level");
    await as(lead).post(`/api/actions/${action.id}/start`);
    await as(lead)
      .post(`/api/actions/${action.id}/proofs`)
      .field("id", crypto.randomUUID())
      .attach("photo", await jpegWithGps(), "fix.jpg");
    await as(lead).post(`/api/actions/${action.id}/ask-check`).send({ note: "Poster back up" });
    const [row] = await mail.deps.db
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.id, action.id));
    expect(await scheduler().tick(new Date(row!.dueAt.getTime() + day))).toBe(0);
  });

  it("when an action is reopened, then the owner is told why", async () => {
    const action = await failedAudit("Floor clear and dry");
    await as(lead).post(`/api/actions/${action.id}/start`);
    await as(lead)
      .post(`/api/actions/${action.id}/proofs`)
      .field("id", crypto.randomUUID())
      .attach("photo", await jpegWithGps(), "fix.jpg");
    await as(lead).post(`/api/actions/${action.id}/ask-check`).send({ note: "Mopped" });
    await as(auditor).post(`/api/actions/${action.id}/confirm`).send({ note: "Dry now" });
    await as(secondAuditor)
      .post(`/api/actions/${action.id}/reopen`)
      .send({ reason: "Puddle under the dirty chair again" });
    const reopened = await mail.catcher.waitFor((messages) =>
      messages.some((m) => m.subject.startsWith("Action reopened")),
    );
    const message = reopened.find((m) => m.subject.startsWith("Action reopened"))!;
    expect(message.to).toEqual([lead.user.email]);
    expect(message.text).toContain("Puddle under the dirty chair again");
    expect(message.text).toContain(secondAuditor.user.displayName);
  });
});
