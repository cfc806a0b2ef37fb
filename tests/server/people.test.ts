import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { changeLog, userTokens, users } from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api } from "../helpers/app";
import { sessionCookieFor, signInAs, type SignedInPerson } from "../helpers/auth";
import { createMailTestApp, linkIn, mailTo, type MailTestApp } from "../helpers/mail";

const cookieOf = (response: { headers: Record<string, unknown> }) =>
  String(
    (response.headers["set-cookie"] as string[]).find((c) => c.startsWith("lintel_session=")),
  ).split(";")[0]!;

describe("people", () => {
  let mail: MailTestApp;
  let networkId = "";
  let siteA = "";
  let siteB = "";
  let admin: SignedInPerson;
  let adminOfA: SignedInPerson;

  beforeAll(async () => {
    mail = await createMailTestApp();
    const { db } = mail.deps;
    networkId = (await insertNetwork(db)).id;
    siteA = (await insertSite(db, networkId, { name: "Site A" })).id;
    siteB = (await insertSite(db, networkId, { name: "Site B" })).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }], { app: mail });
    adminOfA = await signInAs(networkId, [{ role: "administrator", siteId: siteA }], { app: mail });
  });
  afterAll(() => mail.close());

  const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });
  const invite = (by: SignedInPerson, email: string, grants: object[]) =>
    as(by).post("/api/people/invitations").send({ email, name: "Nia Calloway", grants });

  describe("invitations", () => {
    it("when an administrator invites someone, then one e-mail arrives whose link sets the password and signs them in to their site only", async () => {
      const response = await invite(adminOfA, "Nia.Calloway@Example.org", [
        { role: "auditor", siteId: siteA },
      ]);
      expect(response.status).toBe(201);
      expect(response.body.person).toMatchObject({
        email: "nia.calloway@example.org",
        status: "invited",
      });
      expect(response.body.person.invitationExpiresAt).toBeTruthy();

      await mail.catcher.waitFor(
        () => mailTo(mail.catcher, "nia.calloway@example.org").length === 1,
      );
      await new Promise((resolve) => setTimeout(resolve, 200));
      const received = mailTo(mail.catcher, "nia.calloway@example.org");
      expect(received).toHaveLength(1);
      expect(received[0]!.subject).toBe("You have been invited to Lintel");
      expect(received[0]!.html).toContain("Choose a password");
      const link = linkIn(received[0]!);
      expect(link.origin).toBe("http://lintel.test");
      const token = link.pathname.split("/").pop()!;

      const info = await api(mail.app).get(`/api/invitations/${token}`);
      expect(info.status).toBe(200);
      expect(info.body).toMatchObject({ email: "nia.calloway@example.org", name: "Nia Calloway" });

      const accepted = await api(mail.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ password: "a long walk to the doffing area" });
      expect(accepted.status).toBe(200);
      expect(accepted.body.roles).toEqual([{ role: "auditor", siteId: siteA }]);
      const sites = await api(mail.app, { cookie: cookieOf(accepted) }).get("/api/sites");
      expect(sites.body.sites.map((s: { id: string }) => s.id)).toEqual([siteA]);

      const signIn = await api(mail.app)
        .post("/api/auth/sign-in")
        .send({ email: "nia.calloway@example.org", password: "a long walk to the doffing area" });
      expect(signIn.status).toBe(200);

      const again = await api(mail.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ password: "another long passphrase" });
      expect(again.status).toBe(410);
      expect(again.body.error.code).toBe("link_invalid");
      expect((await api(mail.app).get(`/api/invitations/${token}`)).status).toBe(410);
    });

    it("when an invitation link has expired, then it is refused and the password stays unset", async () => {
      const email = "expired-invitee@example.org";
      await invite(admin, email, [{ role: "auditor", siteId: siteB }]);
      await mail.catcher.waitFor(() => mailTo(mail.catcher, email).length === 1);
      const token = linkIn(mailTo(mail.catcher, email)[0]!).pathname.split("/").pop()!;
      const { db } = mail.deps;
      const [person] = await db.select().from(users).where(eq(users.email, email));
      await db
        .update(userTokens)
        .set({ expiresAt: new Date(Date.now() - 1000) })
        .where(eq(userTokens.userId, person!.id));

      const response = await api(mail.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ password: "too late for this link" });
      expect(response.status).toBe(410);
      expect(response.body.error.message).toMatch(/expired/);
      const [after] = await db.select().from(users).where(eq(users.id, person!.id));
      expect(after!.passwordHash).toBeNull();
    });

    it("when someone is invited again, then the new link works and the old one does not", async () => {
      const email = "twice-invited@example.org";
      const first = await invite(admin, email, [{ role: "auditor", siteId: siteA }]);
      await mail.catcher.waitFor(() => mailTo(mail.catcher, email).length === 1);
      const resend = await as(admin)
        .post(`/api/people/${first.body.person.id}/invitation`)
        .send({});
      expect(resend.status).toBe(200);
      await mail.catcher.waitFor(() => mailTo(mail.catcher, email).length === 2);
      const [oldMail, newMail] = mailTo(mail.catcher, email);
      const oldToken = linkIn(oldMail!).pathname.split("/").pop();
      const newToken = linkIn(newMail!).pathname.split("/").pop();

      const old = await api(mail.app)
        .post(`/api/invitations/${oldToken}/accept`)
        .send({ password: "using the older link now" });
      expect(old.status).toBe(410);
      expect(old.body.error.message).toMatch(/newer/);
      const fresh = await api(mail.app)
        .post(`/api/invitations/${newToken}/accept`)
        .send({ password: "using the newest link now" });
      expect(fresh.status).toBe(200);
    });

    it("when the password is short, common, or the e-mail address, then 400 names the password and the link still works", async () => {
      const email = "picky.person@example.org";
      await invite(admin, email, [{ role: "facilities_lead", siteId: siteB }]);
      await mail.catcher.waitFor(() => mailTo(mail.catcher, email).length === 1);
      const token = linkIn(mailTo(mail.catcher, email)[0]!).pathname.split("/").pop();
      // NIST SP 800-63B §5.1.1.2: at least 8 characters (Lintel asks 12), no composition rules,
      // and refuse values found in lists of commonly used passwords.
      for (const password of [
        "short-one",
        "qwerty123456",
        "1q2w3e4r5t6y",
        "picky.person-2026",
        "aaaaaaaaaaaaaaaa",
      ]) {
        const response = await api(mail.app)
          .post(`/api/invitations/${token}/accept`)
          .send({ password });
        expect(response.status, password).toBe(400);
        expect(Object.keys(response.body.error.fields)).toEqual(["password"]);
      }
      // Spaces and any characters are allowed: no composition rules.
      const ok = await api(mail.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ password: "correct horse battery staple" });
      expect(ok.status).toBe(200);
    });

    it("when the address already has an active account, then 409 names the e-mail and nothing is sent", async () => {
      const existing = await insertUser(mail.deps.db, networkId, {
        email: "already.here@example.org",
      });
      await mail.deps.db.update(users).set({ passwordHash: "x" }).where(eq(users.id, existing.id));
      const response = await invite(admin, "already.here@example.org", [
        { role: "auditor", siteId: siteA },
      ]);
      expect(response.status).toBe(409);
      expect(response.body.error.fields).toHaveProperty("email");
      expect(mailTo(mail.catcher, "already.here@example.org")).toHaveLength(0);
    });

    it("when the invitation body is wrong, then 400 names the field and nobody is created", async () => {
      const cases: [object, string][] = [
        [{ email: "x@example.org", name: "X", grants: [] }, "grants"],
        [
          { email: "x@example.org", name: "X", grants: [{ role: "auditor", siteId: null }] },
          "grants.0.siteId",
        ],
        [
          { email: "x@example.org", name: "X", grants: [{ role: "overlord", siteId: siteA }] },
          "grants.0.role",
        ],
        [
          {
            email: "x@example.org",
            name: "X",
            grants: [{ role: "auditor", siteId: siteA, extra: 1 }],
          },
          "grants.0.extra",
        ],
        [
          { email: "not-an-email", name: "X", grants: [{ role: "auditor", siteId: siteA }] },
          "email",
        ],
        [
          {
            email: "x@example.org",
            name: "x".repeat(121),
            grants: [{ role: "auditor", siteId: siteA }],
          },
          "name",
        ],
        [
          {
            email: "x@example.org",
            name: "X",
            grants: [{ role: "auditor", siteId: crypto.randomUUID() }],
          },
          "grants.0.siteId",
        ],
      ];
      for (const [body, field] of cases) {
        const response = await as(admin).post("/api/people/invitations").send(body);
        expect(response.status, JSON.stringify(body)).toBe(400);
        expect(response.body.error.fields, JSON.stringify(body)).toHaveProperty([field]);
      }
      expect(
        await mail.deps.db.select().from(users).where(eq(users.email, "x@example.org")),
      ).toHaveLength(0);
    });
  });

  describe("nobody grants above their own", () => {
    it("when a site administrator gives a role at another site or network-wide, then 403 naming the site and nothing changes", async () => {
      const atB = await invite(adminOfA, "someone.at.b@example.org", [
        { role: "auditor", siteId: siteB },
      ]);
      expect(atB.status).toBe(403);
      expect(atB.body.error.fields).toHaveProperty(["grants.0.siteId"]);
      const networkWide = await invite(adminOfA, "someone.wide@example.org", [
        { role: "committee_member", siteId: null },
      ]);
      expect(networkWide.status).toBe(403);
      expect(
        await mail.deps.db.select().from(users).where(eq(users.email, "someone.at.b@example.org")),
      ).toHaveLength(0);

      const person = await insertUser(mail.deps.db, networkId);
      await insertGrant(mail.deps.db, person.id, "auditor", siteA);
      const escalate = await as(adminOfA)
        .post(`/api/people/${person.id}/grants`)
        .send({ role: "administrator", siteId: null });
      expect(escalate.status).toBe(403);
    });

    it("when a site administrator tries to deactivate someone who also works at another site, then 403", async () => {
      const person = await insertUser(mail.deps.db, networkId);
      await insertGrant(mail.deps.db, person.id, "auditor", siteA);
      await insertGrant(mail.deps.db, person.id, "auditor", siteB);
      const response = await as(adminOfA).post(`/api/people/${person.id}/deactivate`).send({});
      expect(response.status).toBe(403);
    });

    it("when a site administrator lists people, then only people with a role at their site appear", async () => {
      const onlyB = await insertUser(mail.deps.db, networkId);
      await insertGrant(mail.deps.db, onlyB.id, "auditor", siteB);
      const response = await as(adminOfA).get("/api/people");
      expect(response.status).toBe(200);
      const ids = response.body.people.map((p: { id: string }) => p.id);
      expect(ids).not.toContain(onlyB.id);
      expect(response.body.manageableSites).toEqual([{ id: siteA, name: "Site A" }]);
      expect(response.body.canGrantNetworkWide).toBe(false);
      expect((await as(adminOfA).get(`/api/people/${onlyB.id}`)).status).toBe(404);
    });
  });

  describe("roles and deactivation", () => {
    it("when a role is given and taken, then both land in the change log with the actor", async () => {
      const person = await insertUser(mail.deps.db, networkId);
      await insertGrant(mail.deps.db, person.id, "auditor", siteA);
      const given = await as(adminOfA)
        .post(`/api/people/${person.id}/grants`)
        .send({ role: "facilities_lead", siteId: siteA });
      expect(given.status).toBe(201);
      const grant = given.body.person.grants.find(
        (g: { role: string }) => g.role === "facilities_lead",
      );
      expect(grant.siteName).toBe("Site A");
      expect(
        (
          await as(adminOfA)
            .post(`/api/people/${person.id}/grants`)
            .send({ role: "facilities_lead", siteId: siteA })
        ).status,
      ).toBe(409);

      const taken = await as(adminOfA).delete(`/api/people/${person.id}/grants/${grant.id}`);
      expect(taken.status).toBe(200);
      expect(taken.body.person.grants.map((g: { role: string }) => g.role)).toEqual(["auditor"]);

      const log = await mail.deps.db
        .select()
        .from(changeLog)
        .where(eq(changeLog.entityId, person.id));
      expect(log.map((row) => [row.action, row.actorId, row.siteId])).toEqual([
        ["role.granted", adminOfA.user.id, siteA],
        ["role.revoked", adminOfA.user.id, siteA],
      ]);
    });

    it("when a person is deactivated, then their open sessions stop working at once, and reactivation lets them sign in again", async () => {
      const person = await signInAs(networkId, [{ role: "auditor", siteId: siteA }], {
        app: mail,
        user: { password: "leaving soon passphrase" },
      });
      const other = await sessionCookieFor(person.user.id, mail);
      expect((await api(mail.app, { cookie: person.cookie }).get("/api/auth/me")).status).toBe(200);

      const response = await as(adminOfA)
        .post(`/api/people/${person.user.id}/deactivate`)
        .send({ reason: "Left the trust" });
      expect(response.status).toBe(200);
      expect(response.body.person.status).toBe("deactivated");
      expect((await api(mail.app, { cookie: person.cookie }).get("/api/auth/me")).status).toBe(401);
      expect((await api(mail.app, { cookie: other }).get("/api/auth/me")).status).toBe(401);
      const [entry] = await mail.deps.db
        .select()
        .from(changeLog)
        .where(
          and(eq(changeLog.entityId, person.user.id), eq(changeLog.action, "user.deactivated")),
        );
      expect(entry).toMatchObject({ actorId: adminOfA.user.id, reason: "Left the trust" });

      const back = await as(adminOfA).post(`/api/people/${person.user.id}/reactivate`).send({});
      expect(back.body.person.status).toBe("active");
      expect(
        (
          await api(mail.app, { cookie: await sessionCookieFor(person.user.id, mail) }).get(
            "/api/auth/me",
          )
        ).status,
      ).toBe(200);
    });

    it("when an administrator deactivates themself, then 400", async () => {
      const response = await as(admin).post(`/api/people/${admin.user.id}/deactivate`).send({});
      expect(response.status).toBe(400);
    });
  });

  describe("password reset", () => {
    it("when a reset is asked for, then the answer is the same for known and unknown addresses and only the known one gets mail", async () => {
      const person = await insertUser(mail.deps.db, networkId, {
        email: "resetter@example.org",
        password: "the original passphrase",
      });
      const other = await sessionCookieFor(person.id, mail);
      const known = await api(mail.app)
        .post("/api/auth/password-reset")
        .send({ email: "Resetter@example.org" });
      const unknown = await api(mail.app)
        .post("/api/auth/password-reset")
        .send({ email: "no-such-person@example.org" });
      expect(known.status).toBe(202);
      expect(unknown.status).toBe(202);
      expect(known.body).toEqual(unknown.body);

      await mail.catcher.waitFor(() => mailTo(mail.catcher, "resetter@example.org").length === 1);
      expect(mailTo(mail.catcher, "no-such-person@example.org")).toHaveLength(0);
      const token = linkIn(mailTo(mail.catcher, "resetter@example.org")[0]!)
        .pathname.split("/")
        .pop();

      expect((await api(mail.app).get(`/api/auth/password-reset/${token}`)).body.email).toBe(
        "resetter@example.org",
      );
      const reset = await api(mail.app)
        .post(`/api/auth/password-reset/${token}`)
        .send({ password: "a brand new passphrase" });
      expect(reset.status).toBe(200);
      // Every other session is signed out; the new one works.
      expect((await api(mail.app, { cookie: other }).get("/api/auth/me")).status).toBe(401);
      expect((await api(mail.app, { cookie: cookieOf(reset) }).get("/api/auth/me")).status).toBe(
        200,
      );
      expect(
        (
          await api(mail.app)
            .post("/api/auth/sign-in")
            .send({ email: "resetter@example.org", password: "the original passphrase" })
        ).status,
      ).toBe(401);
      expect(
        (
          await api(mail.app)
            .post(`/api/auth/password-reset/${token}`)
            .send({ password: "yet another passphrase" })
        ).status,
      ).toBe(410);
    });
  });

  describe("profile", () => {
    it("when a person changes their name, then /me shows it and the change log records it", async () => {
      const person = await signInAs(networkId, [{ role: "auditor", siteId: siteA }], { app: mail });
      const response = await api(mail.app, { cookie: person.cookie })
        .patch("/api/auth/me")
        .send({ name: "  Priya Vantongeren " });
      expect(response.status).toBe(200);
      expect(response.body.user.name).toBe("Priya Vantongeren");
      expect(
        (await api(mail.app, { cookie: person.cookie }).get("/api/auth/me")).body.user.name,
      ).toBe("Priya Vantongeren");
    });

    it("when the current password is wrong, then 400 names it; when right, other sessions end and this one goes on", async () => {
      const person = await signInAs(networkId, [{ role: "auditor", siteId: siteA }], {
        app: mail,
        user: { password: "my current passphrase" },
      });
      const other = await sessionCookieFor(person.user.id, mail);
      const wrong = await api(mail.app, { cookie: person.cookie })
        .post("/api/auth/me/password")
        .send({ currentPassword: "not it at all", newPassword: "a different passphrase" });
      expect(wrong.status).toBe(400);
      expect(Object.keys(wrong.body.error.fields)).toEqual(["currentPassword"]);

      const right = await api(mail.app, { cookie: person.cookie })
        .post("/api/auth/me/password")
        .send({ currentPassword: "my current passphrase", newPassword: "a different passphrase" });
      expect(right.status).toBe(204);
      expect((await api(mail.app, { cookie: other }).get("/api/auth/me")).status).toBe(401);
      expect((await api(mail.app, { cookie: cookieOf(right) }).get("/api/auth/me")).status).toBe(
        200,
      );
    });
  });
});
