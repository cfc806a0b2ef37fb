import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { changeLog, identityLinks, sessions } from "../../server/db/schema/index";
import { api, testApp } from "../helpers/app";
import {
  finishAtLintel,
  providerWorld,
  sessionCookieOf,
  signInAtProvider,
  startTestProvider,
  type TestProvider,
} from "../helpers/identity-provider";

let provider: TestProvider;

beforeAll(async () => {
  provider = await startTestProvider();
});
afterAll(async () => {
  await provider.stop();
});

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

    const { db } = testApp().deps;
    const links = await db
      .select()
      .from(identityLinks)
      .where(eq(identityLinks.userId, world.user.id));
    expect(links.map((l) => l.subject)).toEqual([world.sub]);
    const log = await db
      .select()
      .from(changeLog)
      .where(
        and(eq(changeLog.entityId, world.user.id), eq(changeLog.action, "user.signed_in_provider")),
      );
    expect(log).toHaveLength(1);
    expect(log[0]!.reason).toBe("signed in through Test Health");
    const rows = await db.select().from(sessions).where(eq(sessions.userId, world.user.id));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.providerId).toBe(world.providerId);
  });
});
