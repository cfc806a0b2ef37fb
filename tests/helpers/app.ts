import { randomInt } from "node:crypto";

import supertest from "supertest";
import type { Express } from "express";

import { createApp } from "../../server/app";
import { connectDatabase, type DatabaseHandle } from "../../server/db/client";
import { buildDeps } from "../../server/deps";
import { createLogger } from "../../server/lib/logger";
import { createStorage } from "../../server/lib/storage";
import type { AppDeps } from "../../server/lib/routes";
import { testEnv, testOrigin } from "./test-env";

export interface TestApp {
  app: Express;
  deps: AppDeps;
  database: DatabaseHandle;
}

let shared: TestApp | undefined;

/** Builds an app on the test database; with overrides, a separate one (close it after). */
export function createTestApp(
  overrides?: Record<string, string>,
  notifyOutbox?: () => void,
  options: { mailCatcherDir?: string } = {},
): TestApp {
  const env = testEnv(overrides);
  const logger = createLogger(env.LOG_LEVEL);
  const database = connectDatabase(env.DATABASE_URL, { max: 4, logger });
  const deps = buildDeps(env, database, logger, createStorage(env), notifyOutbox, options);
  return { app: createApp(deps), deps, database };
}

/** The app most tests share within a worker. */
export function testApp(): TestApp {
  shared ??= createTestApp();
  return shared;
}

/** A client address of its own for each caller, so address-based limits do not cross tests. */
export function randomAddress(): string {
  return `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;
}

/**
 * supertest against the app, sending what the app's own pages send: the Origin header, the
 * session cookie when given, and a client address.
 */
export function api(
  app: Express = testApp().app,
  options: { cookie?: string; origin?: string | null } = {},
) {
  const address = randomAddress();
  const agent = supertest(app);
  const decorate = (test: supertest.Test) => {
    test.set("X-Forwarded-For", address);
    if (options.origin !== null) test.set("Origin", options.origin ?? testOrigin);
    if (options.cookie) test.set("Cookie", options.cookie);
    return test;
  };
  return {
    get: (url: string) => decorate(agent.get(url)),
    post: (url: string) => decorate(agent.post(url)),
    patch: (url: string) => decorate(agent.patch(url)),
    put: (url: string) => decorate(agent.put(url)),
    delete: (url: string) => decorate(agent.delete(url)),
    request: (method: "get" | "post" | "put" | "patch" | "delete", url: string) =>
      decorate(agent[method](url)),
  };
}
