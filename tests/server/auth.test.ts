import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { sessions, users } from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api, createTestApp, randomAddress, testApp, type TestApp } from "../helpers/app";
import { sessionCookieFor, signInAs } from "../helpers/auth";
import { testOrigin } from "../helpers/test-env";

const password = "correct horse battery staple";

function cookieFrom(response: { headers: Record<string, unknown> }): string | undefined {
  const header = response.headers["set-cookie"] as string[] | undefined;
  return header?.find((value) => value.startsWith("lintel_session="));
}

describe("sign-in", () => {
  let networkId = "";
  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
  });

  it("when the e-mail and password match, then 200 with the person, their roles and an httpOnly Lax cookie", async () => {
    const { db } = testApp().deps;
    const site = await insertSite(db, networkId);
    const user = await insertUser(db, networkId, {
      password,
      email: "Sign.In.Person@Example.org".toLowerCase(),
    });
    await insertGrant(db, user.id, "auditor", site.id);

    const response = await api()
      .post("/api/auth/sign-in")
      .send({ email: "  SIGN.IN.PERSON@example.org ", password });

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      user: { id: user.id, email: user.email, name: user.displayName },
      roles: [{ role: "auditor", siteId: site.id }],
    });
    const cookie = cookieFrom(response)!;
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).not.toMatch(/Secure/);
    expect(JSON.stringify(response.body)).not.toContain("argon2");

    const me = await api(undefined, { cookie: cookie.split(";")[0] }).get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(user.id);
  });

  it("when the public URL is https, then the cookie is Secure", async () => {
    const secure = createTestApp({ LINTEL_PUBLIC_URL: "https://lintel.example.org" });
    try {
      await insertUser(secure.deps.db, networkId, { password, email: "secure-cookie@example.org" });
      const response = await api(secure.app, { origin: "https://lintel.example.org" })
        .post("/api/auth/sign-in")
        .send({ email: "secure-cookie@example.org", password });
      expect(response.status).toBe(200);
      expect(cookieFrom(response)).toMatch(/Secure/);
    } finally {
      await secure.database.close();
    }
  });

  it("when the password is wrong or the e-mail unknown, then 401 with one message for both and no session", async () => {
    const { db } = testApp().deps;
    const user = await insertUser(db, networkId, { password });
    const before = await db.select().from(sessions).where(eq(sessions.userId, user.id));

    const wrong = await api()
      .post("/api/auth/sign-in")
      .send({ email: user.email, password: "not the password" });
    const unknown = await api()
      .post("/api/auth/sign-in")
      .send({ email: "nobody-here@example.org", password });

    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe("invalid_credentials");
    expect(cookieFrom(wrong)).toBeUndefined();
    expect(await db.select().from(sessions).where(eq(sessions.userId, user.id))).toHaveLength(
      before.length,
    );
  });

  it("when the account is deactivated, then the right password still answers 401", async () => {
    const user = await insertUser(testApp().deps.db, networkId, {
      password,
      deactivatedAt: new Date(),
    });
    const response = await api().post("/api/auth/sign-in").send({ email: user.email, password });
    expect(response.status).toBe(401);
  });

  it("when the person has no password yet (invited), then 401", async () => {
    const user = await insertUser(testApp().deps.db, networkId);
    const response = await api().post("/api/auth/sign-in").send({ email: user.email, password });
    expect(response.status).toBe(401);
  });

  it("when the body is malformed, then 400 naming each field", async () => {
    const cases: [unknown, string[]][] = [
      [{}, ["email", "password"]],
      [{ email: "not-an-address", password }, ["email"]],
      [{ email: "a@example.org", password: 12345 }, ["password"]],
      [{ email: "a@example.org", password, remember: true }, ["remember"]],
      [{ email: `${"a".repeat(250)}@example.org`, password }, ["email"]],
      [{ email: "a@example.org", password: "x".repeat(257) }, ["password"]],
    ];
    for (const [body, fields] of cases) {
      const response = await api()
        .post("/api/auth/sign-in")
        .send(body as object);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.code).toBe("validation_failed");
      expect(Object.keys(response.body.error.fields).sort()).toEqual(fields.sort());
    }
  });

  it("when the JSON cannot be parsed, then 400 in the envelope", async () => {
    const response = await api()
      .post("/api/auth/sign-in")
      .set("Content-Type", "application/json")
      .send('{"email": ');
    expect(response.status).toBe(400);
    expect(response.body.error).toMatchObject({
      code: "bad_request",
      fields: { body: "Not valid JSON." },
    });
  });
});

describe("sign-in limits", () => {
  let limited: TestApp;
  let networkId = "";
  beforeAll(async () => {
    limited = createTestApp({ LINTEL_LOGIN_LIMIT_ACCOUNT: "3", LINTEL_LOGIN_LIMIT_ADDRESS: "5" });
    networkId = (await insertNetwork(limited.deps.db)).id;
  });
  afterAll(() => limited.database.close());

  it("when one account fails past its limit, then 429 with Retry-After, even with the right password", async () => {
    const user = await insertUser(limited.deps.db, networkId, { password });
    for (let attempt = 0; attempt < 3; attempt += 1) {
      const response = await api(limited.app)
        .post("/api/auth/sign-in")
        .send({ email: user.email, password: "wrong" });
      expect(response.status).toBe(401);
    }
    const blocked = await api(limited.app)
      .post("/api/auth/sign-in")
      .send({ email: user.email, password });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("rate_limited");
    expect(Number(blocked.headers["retry-after"])).toBeGreaterThan(0);
  });

  it("when one address fails past its limit across accounts, then 429 for that address only", async () => {
    const address = randomAddress();
    const user = await insertUser(limited.deps.db, networkId, { password });
    const post = (from: string, body: object) =>
      api(limited.app).post("/api/auth/sign-in").set("X-Forwarded-For", from).send(body);
    for (let attempt = 0; attempt < 5; attempt += 1) {
      const response = await post(address, {
        email: `guess-${attempt}@example.org`,
        password: "wrong",
      });
      expect(response.status).toBe(401);
    }
    expect((await post(address, { email: user.email, password })).status).toBe(429);
    expect((await post(randomAddress(), { email: user.email, password })).status).toBe(200);
  });
});

describe("sessions", () => {
  let networkId = "";
  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
  });

  it("when signed out, then /me answers 401 in the envelope", async () => {
    const response = await api().get("/api/auth/me");
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe("unauthenticated");
  });

  it("when the cookie holds garbage, then 401 and the cookie is cleared", async () => {
    const response = await api(undefined, { cookie: "lintel_session=not-a-session" }).get(
      "/api/auth/me",
    );
    expect(response.status).toBe(401);
    expect(cookieFrom(response)).toMatch(/Max-Age=0/);
  });

  it("when the person signs out, then the session row is gone and the cookie stops working", async () => {
    const { user, cookie } = await signInAs(networkId, []);
    const response = await api(undefined, { cookie }).post("/api/auth/sign-out");
    expect(response.status).toBe(204);
    expect(cookieFrom(response)).toMatch(/Max-Age=0/);
    expect(
      await testApp().deps.db.select().from(sessions).where(eq(sessions.userId, user.id)),
    ).toHaveLength(0);
    expect((await api(undefined, { cookie }).get("/api/auth/me")).status).toBe(401);
  });

  it("when a person is deactivated, then every session of theirs stops working at once", async () => {
    const { db } = testApp().deps;
    const { user, cookie } = await signInAs(networkId, []);
    const second = await sessionCookieFor(user.id);
    expect((await api(undefined, { cookie }).get("/api/auth/me")).status).toBe(200);

    await db.update(users).set({ deactivatedAt: new Date() }).where(eq(users.id, user.id));

    expect((await api(undefined, { cookie }).get("/api/auth/me")).status).toBe(401);
    expect((await api(undefined, { cookie: second }).get("/api/auth/me")).status).toBe(401);
    expect(await db.select().from(sessions).where(eq(sessions.userId, user.id))).toHaveLength(0);
  });

  it("when a session has expired, then 401", async () => {
    const { db } = testApp().deps;
    const { user, cookie } = await signInAs(networkId, []);
    await db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.userId, user.id));
    expect((await api(undefined, { cookie }).get("/api/auth/me")).status).toBe(401);
  });

  it("when a session is used in the second half of its life, then it is extended and a fresh cookie is sent", async () => {
    const { db } = testApp().deps;
    const { user, cookie } = await signInAs(networkId, []);
    const soon = new Date(Date.now() + 60 * 60 * 1000);
    await db.update(sessions).set({ expiresAt: soon }).where(eq(sessions.userId, user.id));

    const response = await api(undefined, { cookie }).get("/api/auth/me");

    expect(response.status).toBe(200);
    expect(cookieFrom(response)).toMatch(/Max-Age=\d{6,}/);
    const [row] = await db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(row!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 13 * 24 * 60 * 60 * 1000);
  });
});

describe("same-origin check on state-changing requests", () => {
  it("when Origin is missing, then 403 before anything else happens", async () => {
    const response = await api(undefined, { origin: null })
      .post("/api/auth/sign-in")
      .send({ email: "a@example.org", password });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe("bad_origin");
  });

  it("when Origin is another site, then 403", async () => {
    const response = await api(undefined, { origin: "https://elsewhere.example" })
      .post("/api/auth/sign-in")
      .send({ email: "a@example.org", password });
    expect(response.status).toBe(403);
  });

  it("when only a Referer from the app is sent, then the request is let through", async () => {
    const response = await api(undefined, { origin: null })
      .post("/api/auth/sign-in")
      .set("Referer", `${testOrigin}/sign-in`)
      .send({ email: "nobody-at-all@example.org", password });
    expect(response.status).toBe(401);
  });

  it("when the request is a read, then no Origin is needed", async () => {
    const response = await api(undefined, { origin: null }).get("/api/health");
    expect(response.status).toBe(200);
  });
});
