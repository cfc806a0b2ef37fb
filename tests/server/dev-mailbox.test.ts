import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api, createTestApp, type TestApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { createMailTestApp, type MailTestApp } from "../helpers/mail";

describe("demo mailbox", () => {
  let mail: MailTestApp;
  let dir = "";
  let adminA: SignedInPerson;
  let adminB: SignedInPerson;
  let siteA = "";
  let siteB = "";

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), "lintel-mailbox-test-"));
    mail = await createMailTestApp({}, { mailCatcherDir: dir });
    const { db } = mail.deps;
    const networkA = (await insertNetwork(db)).id;
    const networkB = (await insertNetwork(db)).id;
    siteA = (await insertSite(db, networkA)).id;
    siteB = (await insertSite(db, networkB)).id;
    adminA = await signInAs(networkA, [{ role: "administrator", siteId: null }], { app: mail });
    adminB = await signInAs(networkB, [{ role: "administrator", siteId: null }], { app: mail });
  });
  afterAll(async () => {
    await mail.close();
    rmSync(dir, { recursive: true, force: true });
  });

  const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });

  it("when two networks each invite someone, then each network's administrator sees only the invitation to their own person", async () => {
    const inviteA = await as(adminA)
      .post("/api/people/invitations")
      .send({
        email: "quill.arbery@example.org",
        name: "Quill Arbery",
        grants: [{ role: "auditor", siteId: siteA }],
      });
    const inviteB = await as(adminB)
      .post("/api/people/invitations")
      .send({
        email: "orla.venn@example.org",
        name: "Orla Venn",
        grants: [{ role: "administrator", siteId: siteB }],
      });
    expect([inviteA.status, inviteB.status]).toEqual([201, 201]);
    await mail.catcher.waitFor((messages) => messages.length >= 2);

    const seenByA = await as(adminA).get("/api/dev/mailbox");
    const seenByB = await as(adminB).get("/api/dev/mailbox");
    expect(seenByA.status).toBe(200);
    expect(seenByB.status).toBe(200);
    const recipients = (body: { messages: { to: string[] }[] }) =>
      body.messages.flatMap((message) => message.to);
    expect(recipients(seenByA.body)).toEqual(["quill.arbery@example.org"]);
    expect(recipients(seenByB.body)).toEqual(["orla.venn@example.org"]);
    // Nothing of the other network's invitation reaches the page, not even its link.
    expect(JSON.stringify(seenByA.body)).not.toContain("orla.venn");
  });

  it("when one address has an account in network B and a pending invitation from network A, then neither network's mailbox shows the other's mail to it", async () => {
    const address = `wren.halloway.${Date.now()}@example.org`;
    const { db } = mail.deps;
    const held = await insertUser(db, adminB.user.networkId, {
      email: address,
      displayName: "Wren Halloway",
      password: "a passphrase of network B",
    });
    await insertGrant(db, held.id, "auditor", siteB);

    // Network A invites the address; its holder is told by e-mail, network B is told nothing.
    const invite = await as(adminA)
      .post("/api/people/invitations")
      .send({
        email: address,
        name: "Wren Halloway",
        grants: [{ role: "auditor", siteId: siteA }],
      });
    expect(invite.status).toBe(201);
    // Network B's account asks for a reset link: its mail carries a live link into network B.
    const reset = await api(mail.app).post("/api/auth/password-reset").send({ email: address });
    expect(reset.status).toBeLessThan(300);
    await mail.catcher.waitFor(
      (messages) => messages.filter((message) => message.to.includes(address)).length >= 2,
    );

    const subjectsTo = async (person: SignedInPerson) => {
      const response = await as(person).get("/api/dev/mailbox");
      expect(response.status).toBe(200);
      return (response.body.messages as { to: string[]; subject: string; text: string }[]).filter(
        (message) => message.to.includes(address),
      );
    };
    const seenByA = await subjectsTo(adminA);
    const seenByB = await subjectsTo(adminB);
    expect(seenByA).toHaveLength(1);
    expect(seenByB).toHaveLength(1);
    expect(JSON.stringify(seenByA)).not.toContain("/reset-password/");
    expect(JSON.stringify(seenByB)).toContain("/reset-password/");
    expect(seenByB[0]!.subject).not.toBe(seenByA[0]!.subject);
  });

  it("when the catcher is running, then the installation says the mailbox exists", async () => {
    const response = await api(mail.app).get("/api/app-config");
    expect(response.body).toEqual({ demoMailbox: true });
  });
});

describe("demo mailbox without the local mail catcher", () => {
  let plain: TestApp;
  beforeAll(() => {
    // Demo data on, but no catcher started by this process: a deployment's `server/index.ts`.
    plain = createTestApp({ LINTEL_DEMO: "1" });
  });
  afterAll(() => plain.database.close());

  it("when the catcher does not run, then the mailbox route does not exist and the installation says so", async () => {
    const network = await insertNetwork(plain.deps.db);
    const admin = await signInAs(network.id, [{ role: "administrator", siteId: null }], {
      app: plain,
    });
    const response = await api(plain.app, { cookie: admin.cookie }).get("/api/dev/mailbox");
    expect(response.status).toBe(404);
    expect(response.body.error.message).toBe("There is no API route GET /api/dev/mailbox.");
    expect((await api(plain.app).get("/api/app-config")).body).toEqual({ demoMailbox: false });
  });
});
