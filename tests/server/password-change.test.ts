import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { users } from "../../server/db/schema/index";
import { insertNetwork, insertUser } from "../factories/records";
import { api, createTestApp, type TestApp } from "../helpers/app";
import { sessionCookieFor } from "../helpers/auth";

describe("changing one's password counts wrong current passwords like failed sign-ins", () => {
  let limited: TestApp;
  let networkId = "";
  const current = "the passphrase I have now";

  beforeAll(async () => {
    limited = createTestApp({ LINTEL_LOGIN_LIMIT_ACCOUNT: "3", LINTEL_LOGIN_LIMIT_ADDRESS: "50" });
    networkId = (await insertNetwork(limited.deps.db)).id;
  });
  afterAll(() => limited.database.close());

  async function personWithSession() {
    const user = await insertUser(limited.deps.db, networkId, { password: current });
    let cookie = await sessionCookieFor(user.id, limited);
    const change = async (currentPassword: string, newPassword = "a brand new passphrase") => {
      const response = await api(limited.app, { cookie })
        .post("/api/auth/me/password")
        .send({ currentPassword, newPassword });
      // A change signs out every other session and gives this one a new cookie.
      const renewed = (response.headers["set-cookie"] as unknown as string[] | undefined)?.find(
        (c) => c.startsWith("lintel_session="),
      );
      if (renewed) cookie = renewed.split(";")[0]!;
      return response;
    };
    const storedHash = async () =>
      (await limited.deps.db.select().from(users).where(eq(users.id, user.id)))[0]!.passwordHash;
    return { user, change, storedHash };
  }

  it("when the current password is wrong past the limit, then 429 with Retry-After even with the right one, nothing changes, and sign-in waits too", async () => {
    const { user, change, storedHash } = await personWithSession();
    const before = await storedHash();
    for (let attempt = 0; attempt < 3; attempt += 1) {
      const wrong = await change(`not my passphrase ${attempt}`);
      expect(wrong.status).toBe(400);
      expect(Object.keys(wrong.body.error.fields)).toEqual(["currentPassword"]);
    }

    const blocked = await change(current);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("rate_limited");
    expect(blocked.body.error.message).toMatch(/Too many wrong passwords/);
    expect(Number(blocked.headers["retry-after"])).toBeGreaterThan(0);
    expect(await storedHash()).toBe(before);

    // One secret, one budget: guessing here does not buy fresh guesses at the sign-in page.
    const signIn = await api(limited.app)
      .post("/api/auth/sign-in")
      .send({ email: user.email, password: current });
    expect(signIn.status).toBe(429);
  });

  it("when the right current password is given before the limit, then earlier failures are forgotten, as after a sign-in", async () => {
    const { change } = await personWithSession();
    expect((await change("wrong once")).status).toBe(400);
    expect((await change("wrong twice")).status).toBe(400);
    expect((await change(current, "the second passphrase")).status).toBe(204);

    expect((await change("wrong again once")).status).toBe(400);
    expect((await change("wrong again twice")).status).toBe(400);
    expect((await change("the second passphrase", "the third passphrase")).status).toBe(204);
  });
});
