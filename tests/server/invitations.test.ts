import { and, eq, isNull } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { changeLog, outbox, roleGrants, userTokens, users } from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { issueTestLink } from "../helpers/links";
import { createMailTestApp, type MailTestApp } from "../helpers/mail";

describe("invitations", () => {
  let mail: MailTestApp;
  let networkId = "";
  let siteA = "";
  let admin: SignedInPerson;
  let adminOfA: SignedInPerson;

  beforeAll(async () => {
    mail = await createMailTestApp();
    const { db } = mail.deps;
    networkId = (await insertNetwork(db)).id;
    siteA = (await insertSite(db, networkId, { name: "Site A" })).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }], { app: mail });
    adminOfA = await signInAs(networkId, [{ role: "administrator", siteId: siteA }], { app: mail });
  });
  afterAll(() => mail.close());

  const as = (person: SignedInPerson) => api(mail.app, { cookie: person.cookie });
  const invite = (by: SignedInPerson, email: string, name: string, grants: object[]) =>
    as(by).post("/api/people/invitations").send({ email, name, grants });

  /** Everything a re-invitation could change, to compare before and after a refusal. */
  async function stateOf(userId: string, email: string) {
    const { db } = mail.deps;
    const [person] = await db
      .select({ name: users.displayName })
      .from(users)
      .where(eq(users.id, userId));
    const grants = await db
      .select({ role: roleGrants.role, siteId: roleGrants.siteId })
      .from(roleGrants)
      .where(eq(roleGrants.userId, userId))
      .orderBy(roleGrants.role);
    const openLinks = await db
      .select({ id: userTokens.id })
      .from(userTokens)
      .where(and(eq(userTokens.userId, userId), isNull(userTokens.revokedAt)));
    const mails = await db
      .select({ id: outbox.id })
      .from(outbox)
      .where(eq(outbox.recipient, email));
    const changes = await db
      .select({ action: changeLog.action })
      .from(changeLog)
      .where(eq(changeLog.entityId, userId));
    return { name: person!.name, grants, openLinks, mails: mails.length, changes };
  }

  describe("never beyond your own reach", () => {
    it("when a site administrator re-invites a pending network-wide administrator, then 403 names the e-mail and nothing changes: no rename, no role, no link revoked, no e-mail", async () => {
      const email = "pending.wide@example.org";
      const first = await invite(admin, email, "Wren Halloway", [
        { role: "administrator", siteId: null },
      ]);
      expect(first.status).toBe(201);
      const userId = first.body.person.id as string;
      const before = await stateOf(userId, email);
      expect(before.openLinks).toHaveLength(1);

      const again = await invite(adminOfA, email, "Someone Else", [
        { role: "auditor", siteId: siteA },
      ]);
      expect(again.status).toBe(403);
      expect(again.body.error.fields).toHaveProperty("email");
      expect(await stateOf(userId, email)).toEqual(before);
    });

    it("when a site administrator asks for a new link for a pending person who is also a network-wide administrator, then 403 and the old link still works", async () => {
      const email = "pending.wide.and.a@example.org";
      const first = await invite(admin, email, "Odile Marchbank", [
        { role: "administrator", siteId: null },
        { role: "auditor", siteId: siteA },
      ]);
      expect(first.status).toBe(201);
      const userId = first.body.person.id as string;
      const before = await stateOf(userId, email);

      // Visible to the site administrator through the role at their site, yet beyond their reach.
      expect((await as(adminOfA).get(`/api/people/${userId}`)).status).toBe(200);
      const resend = await as(adminOfA).post(`/api/people/${userId}/invitation`).send({});
      expect(resend.status).toBe(403);
      const reinvite = await invite(adminOfA, email, "Odile M.", [
        { role: "auditor", siteId: siteA },
      ]);
      expect(reinvite.status).toBe(403);
      expect(await stateOf(userId, email)).toEqual(before);
    });

    it("when a site administrator asks for a new link for a pending network-wide administrator they cannot see, then 404", async () => {
      const email = "pending.wide.unseen@example.org";
      const first = await invite(admin, email, "Bram Ellery", [
        { role: "committee_member", siteId: null },
      ]);
      const userId = first.body.person.id as string;
      const before = await stateOf(userId, email);
      const resend = await as(adminOfA).post(`/api/people/${userId}/invitation`).send({});
      expect(resend.status).toBe(404);
      expect(await stateOf(userId, email)).toEqual(before);
    });

    it("when a site administrator re-invites a pending person wholly at their site, then the name, role and link are renewed", async () => {
      const email = "pending.at.a@example.org";
      const first = await invite(adminOfA, email, "Tamsin Roe", [
        { role: "auditor", siteId: siteA },
      ]);
      const userId = first.body.person.id as string;
      const again = await invite(adminOfA, email, "Tamsin Roe-Ashby", [
        { role: "facilities_lead", siteId: siteA },
      ]);
      expect(again.status).toBe(201);
      const after = await stateOf(userId, email);
      expect(after.name).toBe("Tamsin Roe-Ashby");
      expect(after.grants).toHaveLength(2);
      expect(after.openLinks).toHaveLength(1);
      expect(after.mails).toBe(2);
    });
  });

  describe("the same invitation sent at once", () => {
    it("when eight identical invitations arrive in parallel, then one is created (2xx), the rest get 409, and there is one person with one open link", async () => {
      const email = "eight.at.once@example.org";
      const responses = await Promise.all(
        Array.from({ length: 8 }, () =>
          invite(admin, email, "Ines Parlow", [{ role: "auditor", siteId: siteA }]),
        ),
      );
      const statuses = responses.map((response) => response.status);
      expect(statuses.filter((status) => status >= 500)).toEqual([]);
      expect(statuses.filter((status) => status === 201)).toHaveLength(1);
      expect(statuses.every((status) => status === 201 || status === 409)).toBe(true);
      for (const response of responses.filter((r) => r.status === 409)) {
        expect(response.body.error.code).toBe("conflict");
      }
      const people = await mail.deps.db
        .select({ id: users.id })
        .from(users)
        .where(eq(users.email, email));
      expect(people).toHaveLength(1);
      const open = await mail.deps.db
        .select({ id: userTokens.id })
        .from(userTokens)
        .where(and(eq(userTokens.userId, people[0]!.id), isNull(userTokens.revokedAt)));
      expect(open).toHaveLength(1);
    });
  });

  describe("an address that has an account in another network", () => {
    /** The answer with what differs between any two invitations (ids, addresses, times) masked. */
    const shapeOf = (response: { status: number; body: Record<string, unknown> }) => ({
      status: response.status,
      body: JSON.parse(
        JSON.stringify(response.body, (key, value: unknown) =>
          ["id", "email", "createdAt", "invitationExpiresAt"].includes(key) && value !== null
            ? typeof value
            : value,
        ),
      ) as unknown,
    });

    async function otherNetworkWithAccount(email: string) {
      const { db } = mail.deps;
      const otherNetwork = (await insertNetwork(db)).id;
      const otherSite = (await insertSite(db, otherNetwork)).id;
      const holder = await insertUser(db, otherNetwork, {
        email,
        displayName: "Leontine Garvey",
        password: "the holder's own passphrase",
      });
      await insertGrant(db, holder.id, "auditor", otherSite);
      const otherAdmin = await signInAs(otherNetwork, [{ role: "administrator", siteId: null }], {
        app: mail,
      });
      return { holder, otherAdmin };
    }

    it("when an administrator invites it, then the answer and the people list look exactly as for a new address, and the other network and its account are untouched", async () => {
      const known = "leontine.garvey@example.org";
      const { holder, otherAdmin } = await otherNetworkWithAccount(known);
      const { db } = mail.deps;
      const holderBefore = await db.select().from(users).where(eq(users.id, holder.id));
      const otherPeopleBefore = (await as(otherAdmin).get("/api/people")).body;

      const grants = [{ role: "auditor", siteId: siteA }];
      const fresh = await invite(admin, "brand.new.address@example.org", "Leontine Garvey", grants);
      const taken = await invite(admin, known, "Leontine Garvey", grants);
      expect(fresh.status).toBe(201);
      expect(shapeOf(taken)).toEqual(shapeOf(fresh));
      expect(taken.body.person.email).toBe(known);

      // The inviting network sees an ordinary pending invitation, in the list and on its page.
      const list = (await as(admin).get("/api/people")).body.people as { email: string }[];
      const listed = (email: string) => list.find((person) => person.email === email)!;
      expect(shapeOf({ status: 200, body: listed(known) })).toEqual(
        shapeOf({ status: 200, body: listed("brand.new.address@example.org") }),
      );
      const page = await as(admin).get(`/api/people/${taken.body.person.id}`);
      expect(shapeOf(page)).toEqual(shapeOf({ status: 200, body: { person: fresh.body.person } }));

      // The other network is told nothing and its account does not change.
      expect(await db.select().from(users).where(eq(users.id, holder.id))).toEqual(holderBefore);
      expect((await as(otherAdmin).get("/api/people")).body).toEqual(otherPeopleBefore);
      expect(
        await db.select().from(userTokens).where(eq(userTokens.userId, holder.id)),
      ).toHaveLength(0);
      expect(
        await db.select().from(changeLog).where(eq(changeLog.entityId, holder.id)),
      ).toHaveLength(0);

      // The address holder is told, without any link that would join the other network.
      const [notice, ...more] = await db.select().from(outbox).where(eq(outbox.recipient, known));
      expect(more).toHaveLength(0);
      expect(notice!.subject).toBe("An invitation to another Lintel network");
      expect(notice!.textBody).toContain("tied to one network");
      expect(notice!.textBody).not.toMatch(/welcome/);

      // The holder still signs in to their own network, and a reset link is for that account.
      const signIn = await api(mail.app)
        .post("/api/auth/sign-in")
        .send({ email: known, password: "the holder's own passphrase" });
      expect(signIn.status).toBe(200);
      expect(signIn.body.user.id).toBe(holder.id);
      expect(
        (await api(mail.app).post("/api/auth/password-reset").send({ email: known })).status,
      ).toBeLessThan(300);
      const resetLinks = await db
        .select({ userId: userTokens.userId })
        .from(userTokens)
        .where(eq(userTokens.purpose, "password_reset"))
        .innerJoin(users, eq(users.id, userTokens.userId));
      expect(resetLinks.map((row) => row.userId)).toContain(holder.id);
      expect(resetLinks.map((row) => row.userId)).not.toContain(taken.body.person.id);
    });

    it("when the inviting network asks for a new link, then the holder is told again, and no link ever lets them join that network", async () => {
      const known = "hollis.marrow@example.org";
      await otherNetworkWithAccount(known);
      const taken = await invite(admin, known, "Hollis Marrow", [
        { role: "auditor", siteId: siteA },
      ]);
      const placeholder = taken.body.person.id as string;
      const resend = await as(admin).post(`/api/people/${placeholder}/invitation`).send({});
      expect(resend.status).toBe(200);
      expect(resend.body.person.status).toBe("invited");
      const notices = await mail.deps.db.select().from(outbox).where(eq(outbox.recipient, known));
      expect(notices.map((row) => row.subject)).toEqual([
        "An invitation to another Lintel network",
        "An invitation to another Lintel network",
      ]);

      const token = await issueTestLink(placeholder, "invitation", mail);
      expect((await api(mail.app).get(`/api/invitations/${token}`)).status).toBe(410);
      const accept = await api(mail.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ password: "trying to join a second network" });
      expect(accept.status).toBe(410);
      const [row] = await mail.deps.db.select().from(users).where(eq(users.id, placeholder));
      expect(row!.passwordHash).toBeNull();
    });

    it("when new and known addresses are invited in turn, then both answers take about as long", async () => {
      const { db } = mail.deps;
      const otherNetwork = (await insertNetwork(db)).id;
      const rounds = 9;
      for (let round = 0; round < rounds; round += 1) {
        await insertUser(db, otherNetwork, { email: `timed.known.${round}@example.org` });
      }
      const timed = async (email: string) => {
        const started = performance.now();
        const response = await invite(admin, email, "Timed Person", [
          { role: "auditor", siteId: siteA },
        ]);
        expect(response.status).toBe(201);
        return performance.now() - started;
      };
      const fresh: number[] = [];
      const known: number[] = [];
      for (let round = 0; round < rounds; round += 1) {
        fresh.push(await timed(`timed.fresh.${round}@example.org`));
        known.push(await timed(`timed.known.${round}@example.org`));
      }
      const median = (values: number[]) => [...values].sort((a, b) => a - b)[values.length >> 1]!;
      const ratio = median(known) / median(fresh);
      expect(ratio).toBeGreaterThan(1 / 3);
      expect(ratio).toBeLessThan(3);
    });
  });
});
