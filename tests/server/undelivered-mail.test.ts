import { and, eq } from "drizzle-orm";
import { afterEach, beforeEach, describe, expect, it } from "vitest";

import type { ActionSummary } from "@shared/schemas/actions";
import type { UndeliveredMail } from "@shared/schemas/mail";

import { changeLog, outbox } from "../../server/db/schema/index";
import { claimNext } from "../../server/outbox/outbox.repository";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { createMailTestApp, mailTo, type MailTestApp } from "../helpers/mail";

describe("e-mail that may not have arrived", () => {
  let mail: MailTestApp;
  let networkId: string;
  let siteId: string;
  let space: Awaited<ReturnType<typeof insertSpace>>;
  let admin: SignedInPerson;
  let auditor: SignedInPerson;
  let lead: SignedInPerson;

  beforeEach(async () => {
    mail = await createMailTestApp();
    const { db } = mail.deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    space = await insertSpace(db, await insertFloor(db, siteId));
    const options = { app: mail };
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }], options);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }], options);
    lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }], options);
  });
  afterEach(async () => {
    await mail.close();
  });

  const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });

  /** A failed audit item opens an action whose assignment e-mail is caught by a crash mid-send. */
  async function actionWhoseMailWasInterrupted() {
    const { db } = mail.deps;
    await mail.worker.stop();
    const { auditId } = await answeredDraftAudit(mail.deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: ["Spare clean gloves in several sizes"],
    });
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    // A worker claims the e-mail and its process dies before the send finishes.
    const claimed = await claimNext(db, "worker-that-died");
    expect(claimed?.recipient).toBe(lead.user.email);
    await db
      .update(outbox)
      .set({ claimedAt: new Date(Date.now() - 10 * 60 * 1000) })
      .where(eq(outbox.id, claimed!.id));
    // The next process looks, finds the interrupted send and marks it rather than risk a double.
    expect(await mail.extraWorker().drain()).toBe(0);
    return { mailId: claimed!.id, subject: claimed!.subject };
  }

  it("when a crash interrupts an action's e-mail, then the network administrator sees what, to whom and when, and one resend of a double click delivers it exactly once", async () => {
    const { mailId, subject } = await actionWhoseMailWasInterrupted();

    const listed = await as(admin).get("/api/mail/undelivered");
    expect(listed.status).toBe(200);
    const entry = (listed.body.mail as UndeliveredMail[]).find((m) => m.id === mailId);
    expect(entry).toMatchObject({
      topic: "action_assigned",
      recipient: lead.user.email,
      recipientName: lead.user.displayName,
      subject,
      status: "uncertain",
      attempts: 1,
    });
    expect(Date.parse(entry!.queuedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect(entry!.problem).toMatch(/interrupted/);
    // The body may carry a one-time link: it never leaves the server.
    expect(JSON.stringify(listed.body)).not.toContain("http://lintel.test/");
    expect(mail.catcher.messages).toHaveLength(0);

    // A double click: two requests at once.
    const [first, second] = await Promise.all([
      as(admin).post(`/api/mail/${mailId}/resend`).send({}),
      as(admin).post(`/api/mail/${mailId}/resend`).send({}),
    ]);
    expect([first.status, second.status]).toEqual([200, 200]);
    expect([first.body.resent, second.body.resent].sort()).toEqual([false, true]);

    const worker = mail.extraWorker();
    worker.start();
    try {
      await mail.catcher.waitFor(() => mailTo(mail.catcher, lead.user.email).length >= 1);
      // A third click after delivery changes nothing either.
      const late = await as(admin).post(`/api/mail/${mailId}/resend`).send({});
      expect(late.body).toEqual({ id: mailId, status: "sent", resent: false });
      await new Promise((resolve) => setTimeout(resolve, 300)); // room for a duplicate
    } finally {
      await worker.stop();
    }
    const received = mailTo(mail.catcher, lead.user.email);
    expect(received.map((m) => m.messageId)).toEqual([`<${mailId}@lintel.test>`]);
    expect(received[0]!.subject).toBe(subject);

    const [row] = await mail.deps.db.select().from(outbox).where(eq(outbox.id, mailId));
    expect(row!.status).toBe("sent");
    const log = await mail.deps.db
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entity, "mail"), eq(changeLog.entityId, mailId)));
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({
      action: "mail.resent",
      actorId: admin.user.id,
      before: expect.objectContaining({ status: "uncertain", recipient: lead.user.email }),
      after: { status: "pending" },
    });
    expect((await as(admin).get("/api/mail/undelivered")).body.mail).toEqual([]);
  });

  it("when the e-mail was lost, then the action's owner still finds it on their home page", async () => {
    await actionWhoseMailWasInterrupted();
    const mine = await as(lead).get("/api/my/actions");
    expect(mine.status).toBe(200);
    expect((mine.body.actions as ActionSummary[]).map((a) => a.title)).toEqual([
      expect.stringContaining("Spare clean gloves"),
    ]);
  });

  it("when another network's administrator asks, then they see none of it and cannot resend it", async () => {
    const { mailId } = await actionWhoseMailWasInterrupted();
    const otherNetwork = (await insertNetwork(mail.deps.db)).id;
    const stranger = await signInAs(otherNetwork, [{ role: "administrator", siteId: null }], {
      app: mail,
    });
    const listed = await as(stranger).get("/api/mail/undelivered");
    expect(listed.status).toBe(200);
    expect(listed.body.mail).toEqual([]);
    const resend = await as(stranger).post(`/api/mail/${mailId}/resend`).send({});
    expect(resend.status).toBe(404);
    const [row] = await mail.deps.db.select().from(outbox).where(eq(outbox.id, mailId));
    expect(row!.status).toBe("uncertain");
    expect(
      await mail.deps.db.select().from(changeLog).where(eq(changeLog.entityId, mailId)),
    ).toHaveLength(0);
  });

  it("when another network has a pending invitation to the same address, then its administrator still sees none of this network's mail to it", async () => {
    const { mailId } = await actionWhoseMailWasInterrupted();
    const otherNetwork = (await insertNetwork(mail.deps.db)).id;
    const otherSite = (await insertSite(mail.deps.db, otherNetwork)).id;
    const stranger = await signInAs(otherNetwork, [{ role: "administrator", siteId: null }], {
      app: mail,
    });
    const invited = await as(stranger)
      .post("/api/people/invitations")
      .send({
        email: lead.user.email,
        name: lead.user.displayName,
        grants: [{ role: "auditor", siteId: otherSite }],
      });
    expect(invited.status).toBe(201);

    const listed = await as(stranger).get("/api/mail/undelivered");
    expect(listed.status).toBe(200);
    expect((listed.body.mail as UndeliveredMail[]).map((m) => m.id)).not.toContain(mailId);
    expect((await as(stranger).post(`/api/mail/${mailId}/resend`).send({})).status).toBe(404);
    // This network's administrator still sees it.
    const ours = await as(admin).get("/api/mail/undelivered");
    expect((ours.body.mail as UndeliveredMail[]).map((m) => m.id)).toContain(mailId);
  });

  it("when someone who is not a network administrator asks, then both routes refuse with 403 and nothing is queued", async () => {
    const { mailId } = await actionWhoseMailWasInterrupted();
    const siteAdmin = await signInAs(networkId, [{ role: "administrator", siteId }], {
      app: mail,
    });
    for (const person of [siteAdmin, auditor, lead]) {
      expect((await as(person).get("/api/mail/undelivered")).status).toBe(403);
      expect((await as(person).post(`/api/mail/${mailId}/resend`).send({})).status).toBe(403);
    }
    expect((await api(mail.app).get("/api/mail/undelivered")).status).toBe(401);
    const [row] = await mail.deps.db.select().from(outbox).where(eq(outbox.id, mailId));
    expect(row!.status).toBe("uncertain");
  });

  it("when the SMTP server refused an e-mail to the last attempt, then it is listed as failed and can be sent again", async () => {
    await mail.close();
    mail = await createMailTestApp({ LINTEL_OUTBOX_MAX_ATTEMPTS: "1" });
    const { db } = mail.deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }], { app: mail });
    await mail.catcher.stop();
    const invited = await as(admin)
      .post("/api/people/invitations")
      .send({
        email: "bryony.tarrant@example.org",
        name: "Bryony Tarrant",
        grants: [{ role: "auditor", siteId }],
      });
    expect(invited.status).toBe(201);
    await expect
      .poll(async () => (await as(admin).get("/api/mail/undelivered")).body.mail, {
        timeout: 5000,
      })
      .toEqual([
        expect.objectContaining({
          topic: "invitation",
          recipient: "bryony.tarrant@example.org",
          recipientName: "Bryony Tarrant",
          status: "failed",
        }),
      ]);
    const [failed] = (await as(admin).get("/api/mail/undelivered")).body.mail as UndeliveredMail[];
    const id = failed!.id;
    await mail.catcher.start();
    expect((await as(admin).post(`/api/mail/${id}/resend`).send({})).body.resent).toBe(true);
    await mail.catcher.waitFor(
      () => mailTo(mail.catcher, "bryony.tarrant@example.org").length >= 1,
    );
    expect(mailTo(mail.catcher, "bryony.tarrant@example.org")).toHaveLength(1);
  });

  it("when the resend names no e-mail id or carries a stray field, then it answers 400 naming it", async () => {
    const notAnId = await as(admin).post("/api/mail/not-an-id/resend").send({});
    expect(notAnId.status).toBe(400);
    expect(Object.keys(notAnId.body.error.fields)).toEqual(["mailId"]);
    const stray = await as(admin)
      .post(`/api/mail/${crypto.randomUUID()}/resend`)
      .send({ force: true });
    expect(stray.status).toBe(400);
    expect(Object.keys(stray.body.error.fields)).toEqual(["force"]);
  });
});

describe("fixes to check on the auditor's home page", () => {
  let mail: MailTestApp;
  beforeEach(async () => {
    mail = await createMailTestApp();
  });
  afterEach(async () => {
    await mail.close();
  });

  it("when the owner asks for a check, then the site's auditors find it on their home page and nobody else does", async () => {
    const { db } = mail.deps;
    const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });
    const networkId = (await insertNetwork(db)).id;
    const siteId = (await insertSite(db, networkId)).id;
    const otherSite = (await insertSite(db, networkId)).id;
    const space = await insertSpace(db, await insertFloor(db, siteId));
    const options = { app: mail };
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId }], options);
    const twoSiteAuditor = await signInAs(
      networkId,
      [
        { role: "auditor", siteId: otherSite },
        { role: "auditor", siteId },
      ],
      options,
    );
    const elsewhere = await signInAs(networkId, [{ role: "auditor", siteId: otherSite }], options);
    const lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }], options);
    const otherNetwork = (await insertNetwork(db)).id;
    const strangerSite = (await insertSite(db, otherNetwork)).id;
    const stranger = await signInAs(
      otherNetwork,
      [{ role: "auditor", siteId: strangerSite }],
      options,
    );

    const { auditId } = await answeredDraftAudit(mail.deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: ["Spare clean gloves in several sizes"],
    });
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const [action] = (await as(lead).get("/api/my/actions")).body.actions as ActionSummary[];
    // Not yet sent for verification: nothing to verify.
    expect((await as(auditor).get("/api/my/checks")).body.actions).toEqual([]);

    await as(lead).post(`/api/actions/${action!.id}/start`);
    await as(lead)
      .post(`/api/actions/${action!.id}/proofs`)
      .field("id", crypto.randomUUID())
      .attach("photo", await jpegWithGps(), "fix.jpg");
    const sent = await as(lead)
      .post(`/api/actions/${action!.id}/ask-check`)
      .send({ note: "Three glove sizes mounted by the door" });
    expect(sent.status).toBe(200);

    for (const person of [auditor, twoSiteAuditor]) {
      const listed = await as(person).get("/api/my/checks");
      expect(listed.status).toBe(200);
      expect((listed.body.actions as ActionSummary[]).map((a) => [a.id, a.state])).toEqual([
        [action!.id, "to_check"],
      ]);
    }
    for (const person of [elsewhere, lead, stranger]) {
      expect((await as(person).get("/api/my/checks")).body.actions).toEqual([]);
    }
  });
});
