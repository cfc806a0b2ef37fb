import { randomBytes } from "node:crypto";

import { eq } from "drizzle-orm";
import supertest from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { startDemoIdentityProvider } from "../../scripts/lib/identity-provider";
import { freePort } from "../../scripts/lib/process";
import { connectDatabase, type DatabaseHandle } from "../../server/db/client";
import { identityProviderDomains, identityProviders } from "../../server/db/schema/index";
import { demoPassword } from "../../server/demo/people";
import { parseEnv } from "../../server/env";
import { startServer, type RunningServer } from "../../server/server";
import { followProvider } from "../helpers/identity-provider";
import { createIsolatedDatabase } from "../helpers/isolated-database";

// The real server, started as `npm start` starts it, on a database of its own with the demo data.

let url = "";
let database: DatabaseHandle;

function envFor(overrides: Record<string, string> = {}) {
  return parseEnv({
    NODE_ENV: "test",
    DATABASE_URL: url,
    HOST: "127.0.0.1",
    PORT: "0",
    LOG_LEVEL: "silent",
    LINTEL_DEMO: "1",
    LINTEL_OUTBOX_WORKER: "0",
    LINTEL_ACTION_NOTICES: "0",
    S3_ENDPOINT: process.env.S3_ENDPOINT ?? "",
    S3_BUCKET: "lintel-test",
    ...overrides,
  });
}

/** Starts the server with a starter that records whether it was asked to run the provider. */
async function start(overrides: Record<string, string> = {}) {
  let started = 0;
  const port = await freePort();
  const env = envFor({
    PORT: String(port),
    LINTEL_PUBLIC_URL: `http://127.0.0.1:${port}`,
    ...overrides,
  });
  const server = await startServer(env, {
    demoIdentityProvider: async (publicUrl) => {
      started += 1;
      return startDemoIdentityProvider({ publicUrl });
    },
  });
  return { server, started: () => started };
}

async function signInThroughDemoProvider(server: RunningServer, email: string) {
  const lintel = supertest(server.url);
  const startRes = await lintel.get(
    `/api/auth/provider/start?email=${encodeURIComponent(email)}&next=/committee`,
  );
  expect(startRes.status).toBe(302);
  const attempt = ([] as string[]).concat(startRes.headers["set-cookie"] ?? [])[0]!.split(";")[0]!;
  const page = await fetch(startRes.headers.location as string, { redirect: "follow" });
  expect(await page.text()).toContain("Demo identity provider");
  const next = await followProvider(startRes.headers.location as string, { email }, server.url);
  return lintel.get(next.slice(server.url.length)).set("Cookie", attempt);
}

beforeAll(async () => {
  url = await createIsolatedDatabase();
  database = connectDatabase(url, { max: 2 });
});
afterAll(async () => {
  await database.close();
});

describe("the demo's local identity provider", () => {
  it("when npm start runs the demo, then Tamsin Bay Health signs in through its provider and the demo password still works", async () => {
    const { server, started } = await start();
    try {
      expect(started()).toBe(1);
      expect(server.demoIssuer).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
      const [row] = await database.db.select().from(identityProviders);
      expect(row).toMatchObject({
        name: "Tamsin Bay Health",
        issuerUrl: server.demoIssuer,
        passwordAllowed: true,
      });
      const domains = await database.db
        .select({ domain: identityProviderDomains.domain })
        .from(identityProviderDomains)
        .where(eq(identityProviderDomains.providerId, row!.id));
      expect(domains.map((d) => d.domain)).toEqual(["example.org"]);

      const lintel = supertest(server.url);
      const method = await lintel
        .post("/api/auth/sign-in/method")
        .set("Origin", server.url)
        .send({ email: "committee@example.org" });
      expect(method.body).toMatchObject({
        password: true,
        provider: { name: "Tamsin Bay Health" },
      });
      const password = await lintel
        .post("/api/auth/sign-in")
        .set("Origin", server.url)
        .send({ email: "committee@example.org", password: demoPassword });
      expect(password.status).toBe(200);

      const callback = await signInThroughDemoProvider(server, "committee@example.org");
      expect(callback.status).toBe(302);
      expect(callback.headers.location).toBe("/committee");
      const cookie = ([] as string[])
        .concat(callback.headers["set-cookie"] ?? [])
        .find((line) => line.startsWith("lintel_session="))!
        .split(";")[0]!;
      const me = await lintel.get("/api/auth/me").set("Cookie", cookie);
      expect(me.body.user.email).toBe("committee@example.org");
    } finally {
      await server.close();
    }
  });

  it("when the server runs in production, then the demo provider is never started", async () => {
    const { server, started } = await start({
      NODE_ENV: "production",
      LINTEL_SECRET_KEY: randomBytes(32).toString("base64"),
    });
    try {
      expect(started()).toBe(0);
      expect(server.demoIssuer).toBeNull();
    } finally {
      await server.close();
    }
  });

  it("when a network points at a real issuer, then the demo provider is not started", async () => {
    await database.db
      .update(identityProviders)
      .set({ issuerUrl: "https://login.tamsin-bay.example" });
    const { server, started } = await start();
    try {
      expect(started()).toBe(0);
    } finally {
      await server.close();
    }
  });
});
