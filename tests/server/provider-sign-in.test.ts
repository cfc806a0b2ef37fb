import { randomUUID } from "node:crypto";

import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  changeLog,
  identityLinks,
  sessions,
  userTokens,
  users,
} from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertUser } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { sessionCookieFor } from "../helpers/auth";
import { startForgingProvider, type ForgingProvider } from "../helpers/forging-provider";
import {
  configureProvider,
  finishAtLintel,
  providerWorld,
  sessionCookieOf,
  signInAtProvider,
  startTestProvider,
  uniqueDomain,
  type TestProvider,
} from "../helpers/identity-provider";
import { issueTestLink } from "../helpers/links";

let provider: TestProvider;
let forger: ForgingProvider;

beforeAll(async () => {
  [provider, forger] = await Promise.all([startTestProvider(), startForgingProvider()]);
});
afterAll(async () => {
  await Promise.all([provider.stop(), forger.stop()]);
});

const db = () => testApp().deps.db;

async function sessionsOf(userId: string) {
  return db().select().from(sessions).where(eq(sessions.userId, userId));
}

async function linksOf(userId: string) {
  return db().select().from(identityLinks).where(eq(identityLinks.userId, userId));
}

/** The callback's answer is the problem page with this reason, a request id, and no session. */
function expectProblem(res: { status: number; headers: Record<string, unknown> }, reason: string) {
  expect(res.status).toBe(302);
  const location = new URL(String(res.headers.location), "http://lintel.test");
  expect(location.pathname).toBe("/sign-in/problem");
  expect(location.searchParams.get("reason")).toBe(reason);
  expect(location.searchParams.get("request")).toMatch(/^[\w.-]{8,}$/);
  expect(sessionCookieOf(res)).toBeNull();
}

describe("sign-in through the network's identity provider", () => {
  it("when a known person signs in at the provider, then Lintel starts a session, links the subject and logs it", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub, { next: "/committee" });
    const res = await finishAtLintel(trip);
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe("/committee");
    const cookie = sessionCookieOf(res);
    expect(cookie).not.toBeNull();

    const me = await api(undefined, { cookie: cookie! }).get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(world.user.id);

    expect((await linksOf(world.user.id)).map((l) => l.subject)).toEqual([world.sub]);
    const log = await db()
      .select()
      .from(changeLog)
      .where(
        and(eq(changeLog.entityId, world.user.id), eq(changeLog.action, "user.signed_in_provider")),
      );
    expect(log).toHaveLength(1);
    expect(log[0]!.reason).toBe("signed in through Test Health");
    expect(log[0]!.requestId).toBeTruthy();
    const rows = await sessionsOf(world.user.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]!.providerId).toBe(world.providerId);
  });

  it("when the address's domain has a provider, then the sign-in method offers it, the same for known and unknown people", async () => {
    const world = await providerWorld(provider);
    const known = await api().post("/api/auth/sign-in/method").send({ email: world.email });
    const unknown = await api()
      .post("/api/auth/sign-in/method")
      .send({ email: `nobody@${world.domain.toUpperCase()}` });
    expect(known.status).toBe(200);
    expect(known.body).toEqual({
      password: true,
      provider: {
        name: "Test Health",
        startUrl: `/api/auth/provider/start?email=${encodeURIComponent(world.email)}`,
      },
    });
    expect(unknown.body.provider.name).toBe("Test Health");
    expect(unknown.body.password).toBe(true);

    const elsewhere = await api()
      .post("/api/auth/sign-in/method")
      .send({ email: `someone@${uniqueDomain()}` });
    expect(elsewhere.body).toEqual({ password: true, provider: null });
  });

  it("when the start names a next path on another origin, then the person still lands on this site", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub, { next: "//evil.example/x" });
    const res = await finishAtLintel(trip);
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe("/");
  });

  it("when the answer carries another state, then it is refused as not this browser's sign-in", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub);
    const forged = trip.callback.replace(/state=[^&]+/, "state=someone-elses-state");
    expectProblem(await finishAtLintel({ ...trip, callback: forged }), "state");
    expect(await sessionsOf(world.user.id)).toEqual([]);
    expect(await linksOf(world.user.id)).toEqual([]);
  });

  it("when the answer comes back to another browser (no attempt cookie), then it is refused", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub);
    expectProblem(await finishAtLintel({ ...trip, attemptCookie: "" }), "state");
    const other = `lintel_sign_in=${"A".repeat(43)}`;
    expectProblem(await finishAtLintel({ ...trip, attemptCookie: other }), "state");
    expect(await sessionsOf(world.user.id)).toEqual([]);
  });

  it("when the same answer is replayed, then the second one is refused", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub);
    expect(sessionCookieOf(await finishAtLintel(trip))).not.toBeNull();
    expectProblem(await finishAtLintel(trip), "state");
    expect(await sessionsOf(world.user.id)).toHaveLength(1);
  });

  it("when a used code comes back with a fresh sign-in's state, then the provider refuses the code", async () => {
    const world = await providerWorld(provider);
    const first = await signInAtProvider(world.email, world.sub);
    expect(sessionCookieOf(await finishAtLintel(first))).not.toBeNull();
    // A new sign-in in the same browser, answered with the old code.
    const second = await signInAtProvider(world.email, world.sub, {
      attemptCookie: first.attemptCookie,
    });
    const oldCode = new URL(first.callback, "http://x").searchParams.get("code")!;
    const replay = second.callback.replace(/code=[^&]+/, `code=${encodeURIComponent(oldCode)}`);
    expectProblem(await finishAtLintel({ ...second, callback: replay }), "code");
    expect(await sessionsOf(world.user.id)).toHaveLength(1);
  });

  it("when the person cancels at the provider, then the problem page says so", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, "cancel");
    expectProblem(await finishAtLintel(trip), "cancelled");
    expect(await sessionsOf(world.user.id)).toEqual([]);
  });

  it("when the provider does not know the address is verified, then it is refused unless the administrator declared it", async () => {
    const world = await providerWorld(provider);
    provider.updatePerson(world.sub, { emailVerified: false });
    expectProblem(
      await finishAtLintel(await signInAtProvider(world.email, world.sub)),
      "unverified",
    );
    provider.updatePerson(world.sub, { emailVerified: undefined });
    expectProblem(
      await finishAtLintel(await signInAtProvider(world.email, world.sub)),
      "unverified",
    );
    expect(await sessionsOf(world.user.id)).toEqual([]);
    expect(await linksOf(world.user.id)).toEqual([]);

    const declared = await providerWorld(provider, { assumeVerifiedEmail: true });
    provider.updatePerson(declared.sub, { emailVerified: undefined });
    const res = await finishAtLintel(await signInAtProvider(declared.email, declared.sub));
    expect(sessionCookieOf(res)).not.toBeNull();
  });

  it("when the network does not know the person, then they are refused and nothing is created", async () => {
    const world = await providerWorld(provider);
    const stranger = { sub: `sub-${randomUUID()}`, email: `stranger@${world.domain}` };
    provider.addPerson({ ...stranger, name: "Stray Visitor", emailVerified: true });
    const [before] = await db().select({ n: count() }).from(users);
    const [linksBefore] = await db().select({ n: count() }).from(identityLinks);
    expectProblem(
      await finishAtLintel(await signInAtProvider(stranger.email, stranger.sub)),
      "unknown",
    );
    const [after] = await db().select({ n: count() }).from(users);
    const [linksAfter] = await db().select({ n: count() }).from(identityLinks);
    expect(after!.n).toBe(before!.n);
    expect(linksAfter!.n).toBe(linksBefore!.n);
  });

  it("when the person is deactivated, then the provider cannot bring them back, linked or not", async () => {
    const world = await providerWorld(provider);
    await db().update(users).set({ deactivatedAt: new Date() }).where(eq(users.id, world.user.id));
    expectProblem(
      await finishAtLintel(await signInAtProvider(world.email, world.sub)),
      "deactivated",
    );
    expect(await linksOf(world.user.id)).toEqual([]);

    const linked = await providerWorld(provider);
    expect(
      sessionCookieOf(await finishAtLintel(await signInAtProvider(linked.email, linked.sub))),
    ).not.toBeNull();
    await db().update(users).set({ deactivatedAt: new Date() }).where(eq(users.id, linked.user.id));
    await db().delete(sessions).where(eq(sessions.userId, linked.user.id));
    expectProblem(
      await finishAtLintel(await signInAtProvider(linked.email, linked.sub)),
      "deactivated",
    );
    expect(await sessionsOf(linked.user.id)).toEqual([]);
  });

  it("when the person's address changes at the provider, then the linked subject still signs them in, and the old address does not", async () => {
    const world = await providerWorld(provider);
    expect(
      sessionCookieOf(await finishAtLintel(await signInAtProvider(world.email, world.sub))),
    ).not.toBeNull();
    const renamed = `renamed.${randomUUID().slice(0, 6)}@${world.domain}`;
    provider.updatePerson(world.sub, { email: renamed });
    const again = await finishAtLintel(await signInAtProvider(renamed, world.sub));
    const cookie = sessionCookieOf(again);
    expect(cookie).not.toBeNull();
    const me = await api(undefined, { cookie: cookie! }).get("/api/auth/me");
    expect(me.body.user.id).toBe(world.user.id);

    // Someone else now holding the old address at the provider does not get the account.
    const newcomer = { sub: `sub-${randomUUID()}`, email: world.email };
    provider.addPerson({ ...newcomer, name: "New Holder", emailVerified: true });
    expectProblem(
      await finishAtLintel(await signInAtProvider(world.email, newcomer.sub)),
      "unknown",
    );
    expect((await linksOf(world.user.id)).map((l) => l.subject)).toEqual([world.sub]);
  });

  it("when an invited person signs in through the provider first, then the invitation is accepted and logged", async () => {
    const world = await providerWorld(provider);
    const invitee = await insertUser(db(), world.network.id, {
      email: `invitee.${randomUUID().slice(0, 6)}@${world.domain}`,
    });
    await insertGrant(db(), invitee.id, "committee_member", null);
    await issueTestLink(invitee.id, "invitation");
    const sub = `sub-${randomUUID()}`;
    provider.addPerson({
      sub,
      email: invitee.email,
      name: invitee.displayName,
      emailVerified: true,
    });

    const res = await finishAtLintel(await signInAtProvider(invitee.email, sub));
    expect(sessionCookieOf(res)).not.toBeNull();
    const tokens = await db().select().from(userTokens).where(eq(userTokens.userId, invitee.id));
    expect(tokens.every((t) => t.usedAt !== null || t.revokedAt !== null)).toBe(true);
    const joined = await db()
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entityId, invitee.id), eq(changeLog.action, "user.joined")));
    expect(joined).toHaveLength(1);
    const people = await api(undefined, {
      cookie: (await insertAdmin(world.network.id)).cookie,
    }).get("/api/people");
    expect(people.body.people.find((p: { id: string }) => p.id === invitee.id).status).toBe(
      "active",
    );
  });

  it("when an invitation has expired and the person never joined, then the provider does not let them in", async () => {
    const world = await providerWorld(provider);
    const invitee = await insertUser(db(), world.network.id, {
      email: `late.${randomUUID().slice(0, 6)}@${world.domain}`,
    });
    await issueTestLink(invitee.id, "invitation");
    await db()
      .update(userTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(userTokens.userId, invitee.id));
    const sub = `sub-${randomUUID()}`;
    provider.addPerson({
      sub,
      email: invitee.email,
      name: invitee.displayName,
      emailVerified: true,
    });
    expectProblem(await finishAtLintel(await signInAtProvider(invitee.email, sub)), "unknown");
  });
});

async function insertAdmin(networkId: string) {
  const admin = await insertUser(db(), networkId);
  await insertGrant(db(), admin.id, "administrator", null);
  return { user: admin, cookie: await sessionCookieFor(admin.id) };
}

describe("ID tokens that fail a check (made to order by a second provider)", () => {
  async function forgedWorld(options: { assumeVerifiedEmail?: boolean } = {}) {
    const network = await insertNetwork(db());
    const domain = uniqueDomain();
    await configureProvider(network.id, forger, {
      domains: [domain],
      assumeVerifiedEmail: options.assumeVerifiedEmail,
    });
    const user = await insertUser(db(), network.id, {
      email: `forged.${randomUUID().slice(0, 6)}@${domain}`,
      password: "a-long-test-password-1",
    });
    forger.person = { sub: `sub-${randomUUID()}`, email: user.email };
    return { user };
  }

  it("when the token is honest, then the same provider signs the person in (the forgeries below are the only difference)", async () => {
    const { user } = await forgedWorld();
    forger.forgery = "honest";
    const res = await finishAtLintel(await signInAtProvider(user.email, forger.person.sub));
    expect(sessionCookieOf(res)).not.toBeNull();
  });

  for (const [forgery, reason] of [
    ["foreign-signature", "token"],
    ["wrong-audience", "token"],
    ["wrong-issuer", "token"],
    ["expired", "token"],
    ["wrong-nonce", "token"],
    ["unverified", "unverified"],
  ] as const) {
    it(`when the ID token is ${forgery}, then the sign-in ends on the problem page (${reason}) with no session`, async () => {
      const { user } = await forgedWorld();
      forger.forgery = forgery;
      const trip = await signInAtProvider(user.email, forger.person.sub);
      expectProblem(await finishAtLintel(trip), reason);
      expect(await sessionsOf(user.id)).toEqual([]);
      expect(await linksOf(user.id)).toEqual([]);
    });
  }
});

describe("a provider that cannot be reached", () => {
  it("when the provider goes down between start and answer, or before the start, then both end on the problem page", async () => {
    const lonely = await startTestProvider();
    try {
      const world = await providerWorld(lonely);
      const trip = await signInAtProvider(world.email, world.sub);
      await lonely.stop();
      expectProblem(await finishAtLintel(trip), "unavailable");
      expect(await sessionsOf(world.user.id)).toEqual([]);

      // A new network on the same (dead) issuer: its start cannot discover anything.
      const other = await insertNetwork(db());
      const domain = uniqueDomain();
      await configureProvider(other.id, lonely, { domains: [domain] });
      const start = await api().get(
        `/api/auth/provider/start?email=${encodeURIComponent(`x@${domain}`)}`,
      );
      expectProblem(start, "unavailable");
    } finally {
      await lonely.stop();
    }
  });
});

describe("two networks", () => {
  it("when a second network's provider vouches for an address of the first network, then it never signs anyone into the first network", async () => {
    const first = await providerWorld(provider);
    const second = await startTestProvider();
    try {
      const network = await insertNetwork(db());
      const domain = uniqueDomain();
      await configureProvider(network.id, second, { domains: [domain] });
      // The second provider claims the first network's person, with the same subject even.
      second.addPerson({
        sub: first.sub,
        email: first.email,
        name: "Claimed Elsewhere",
        emailVerified: true,
      });
      // It can only be reached through an address of its own domain ...
      const trip = await signInAtProvider(`anyone@${domain}`, first.sub);
      expectProblem(await finishAtLintel(trip), "unknown");
      // ... and a link of the first provider's subject does not carry over.
      expect(
        sessionCookieOf(await finishAtLintel(await signInAtProvider(first.email, first.sub))),
      ).not.toBeNull();
      const trip2 = await signInAtProvider(`anyone@${domain}`, first.sub);
      expectProblem(await finishAtLintel(trip2), "unknown");
      const rows = await sessionsOf(first.user.id);
      expect(rows.map((r) => r.providerId)).toEqual([first.providerId]);
    } finally {
      await second.stop();
    }
  });

  it("when the first network has an account at the second network's domain, then the second network's provider still cannot sign into it", async () => {
    const second = await startTestProvider();
    try {
      const networkB = await insertNetwork(db());
      const domainB = uniqueDomain();
      await configureProvider(networkB.id, second, { domains: [domainB] });
      // Network A (no provider of its own needed) has a person whose address is at B's domain.
      const networkA = await insertNetwork(db());
      const contractor = await insertUser(db(), networkA.id, {
        email: `contractor@${domainB}`,
        password: "a-long-test-password-1",
      });
      second.addPerson({
        sub: "contractor",
        email: contractor.email,
        name: "Contractor",
        emailVerified: true,
      });
      expectProblem(
        await finishAtLintel(await signInAtProvider(contractor.email, "contractor")),
        "unknown",
      );
      expect(await sessionsOf(contractor.id)).toEqual([]);
      expect(await linksOf(contractor.id)).toEqual([]);
    } finally {
      await second.stop();
    }
  });

  it("when the second network keeps a placeholder for the first network's address, then its provider signs in neither", async () => {
    const first = await providerWorld(provider);
    const network = await insertNetwork(db());
    const domain = uniqueDomain();
    const second = await startTestProvider();
    try {
      await configureProvider(network.id, second, { domains: [domain] });
      const [placeholder] = await db()
        .insert(users)
        .values({
          networkId: network.id,
          email: first.email,
          displayName: "Placeholder",
          heldElsewhere: true,
        })
        .returning();
      second.addPerson({ sub: "x1", email: first.email, name: "X", emailVerified: true });
      // The address is outside the second provider's domains, and the row is a placeholder.
      expectProblem(await finishAtLintel(await signInAtProvider(`a@${domain}`, "x1")), "unknown");
      expect(await sessionsOf(placeholder!.id)).toEqual([]);
      expect(await sessionsOf(first.user.id)).toEqual([]);
    } finally {
      await second.stop();
    }
  });
});

describe("sessions begun through the provider", () => {
  it("when begun through the provider, then the session lasts at most the configured hours and is never extended", async () => {
    const world = await providerWorld(provider);
    const res = await finishAtLintel(await signInAtProvider(world.email, world.sub));
    const cookie = sessionCookieOf(res)!;
    const [row] = await sessionsOf(world.user.id);
    const hours = (row!.expiresAt.getTime() - Date.now()) / 3_600_000;
    expect(hours).toBeGreaterThan(11.9);
    expect(hours).toBeLessThanOrEqual(12);

    // One hour left: a password session would be extended now (see below); this one is not.
    const soon = new Date(Date.now() + 3_600_000);
    await db().update(sessions).set({ expiresAt: soon }).where(eq(sessions.id, row!.id));
    const me = await api(undefined, { cookie }).get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(String(me.headers["set-cookie"] ?? "")).not.toContain("lintel_session=");
    const [after] = await sessionsOf(world.user.id);
    expect(after!.expiresAt.getTime()).toBe(soon.getTime());

    // Past its end, it is over.
    await db()
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.id, row!.id));
    expect((await api(undefined, { cookie }).get("/api/auth/me")).status).toBe(401);
  });

  it("when a password session has one hour left, then it is extended as before", async () => {
    const user = await insertUser(db(), (await insertNetwork(db())).id);
    const cookie = await sessionCookieFor(user.id);
    const soon = new Date(Date.now() + 3_600_000);
    await db().update(sessions).set({ expiresAt: soon }).where(eq(sessions.userId, user.id));
    const me = await api(undefined, { cookie }).get("/api/auth/me");
    expect(me.status).toBe(200);
    const [after] = await sessionsOf(user.id);
    expect(after!.expiresAt.getTime()).toBeGreaterThan(soon.getTime() + 86_400_000);
  });

  it("when the configured hours are fewer, then the session ends sooner", async () => {
    const { createTestApp } = await import("../helpers/app");
    const short = createTestApp({ LINTEL_OIDC_SESSION_HOURS: "2" });
    try {
      const world = await providerWorld(provider);
      const res = await finishAtLintel(
        await signInAtProvider(world.email, world.sub, { app: short }),
        short,
      );
      expect(sessionCookieOf(res)).not.toBeNull();
      const [row] = await sessionsOf(world.user.id);
      const hours = (row!.expiresAt.getTime() - Date.now()) / 3_600_000;
      expect(hours).toBeGreaterThan(1.9);
      expect(hours).toBeLessThanOrEqual(2);
    } finally {
      await short.database.close();
    }
  });

  it("when a provider session signs out, then Lintel answers with the provider's end-session address, and the provider ends its session", async () => {
    const world = await providerWorld(provider);
    const trip = await signInAtProvider(world.email, world.sub);
    const cookie = sessionCookieOf(await finishAtLintel(trip))!;
    const res = await api(undefined, { cookie }).post("/api/auth/sign-out");
    expect(res.status).toBe(200);
    const url = new URL(res.body.providerSignOutUrl);
    expect(url.origin).toBe(provider.issuer);
    expect(url.searchParams.get("client_id")).toBe(provider.clientId);
    expect(url.searchParams.get("post_logout_redirect_uri")).toBe("http://lintel.test/sign-in");
    expect(await sessionsOf(world.user.id)).toEqual([]);

    // The provider's page completes by itself and sends the browser back to Lintel's sign-in.
    const page = await trip.browser.fetch(url.toString());
    const html = await page.text();
    const action = /<form[^>]*action="([^"]+)"/.exec(html)![1]!;
    const fields = [...html.matchAll(/<input type="hidden" name="([^"]+)" value="([^"]*)"/g)];
    const done = await trip.browser.fetch(new URL(action, provider.issuer).toString(), {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams(fields.map((f) => [f[1]!, f[2]!])).toString(),
    });
    expect(done.status).toBeGreaterThanOrEqual(300);
    expect(done.headers.get("location")).toBe("http://lintel.test/sign-in");
  });

  it("when a password session signs out, then the answer is 204 as before", async () => {
    const user = await insertUser(db(), (await insertNetwork(db())).id);
    const res = await api(undefined, { cookie: await sessionCookieFor(user.id) }).post(
      "/api/auth/sign-out",
    );
    expect(res.status).toBe(204);
  });
});

describe("passwords for the provider's domains", () => {
  it("when the administrator disallows passwords, then password sign-in and reset for those addresses are refused naming the field", async () => {
    const world = await providerWorld(provider, { passwordAllowed: false });
    const signIn = await api()
      .post("/api/auth/sign-in")
      .send({ email: world.email, password: "a-long-test-password-1" });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.fields.email).toContain("sign in through Test Health");
    expect(sessionCookieOf(signIn)).toBeNull();

    const reset = await api().post("/api/auth/password-reset").send({ email: world.email });
    expect(reset.status).toBe(403);
    expect(reset.body.error.fields.email).toContain("Test Health");
    const token = await issueTestLink(world.user.id, "password_reset");
    const viaLink = await api()
      .post(`/api/auth/password-reset/${token}`)
      .send({ password: "a fresh passphrase after reset" });
    expect(viaLink.status).toBe(403);
    expect(viaLink.body.error.fields.password).toContain("Test Health");

    const method = await api().post("/api/auth/sign-in/method").send({ email: world.email });
    expect(method.body.password).toBe(false);
  });

  it("when passwords stay allowed, then the password still signs the person in", async () => {
    const world = await providerWorld(provider, { passwordAllowed: true });
    const signIn = await api()
      .post("/api/auth/sign-in")
      .send({ email: world.email, password: "a-long-test-password-1" });
    expect(signIn.status).toBe(200);
    const [row] = await db()
      .select({ providerId: sessions.providerId })
      .from(sessions)
      .where(eq(sessions.userId, world.user.id));
    expect(row!.providerId).toBeNull();
  });
});
