import { and, eq, isNull } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { changeLog, outbox, roleGrants, userTokens, users } from "../../server/db/schema/index";
import { insertNetwork, insertSite } from "../factories/records";
import { api } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
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
      expect(statuses.filter((status) => status === 201).length).toBeGreaterThanOrEqual(1);
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
});
