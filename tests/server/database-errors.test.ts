import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { sites } from "../../server/db/schema/index";
import {
  appErrorFromDatabase,
  databaseCodeOf,
  isDatabaseUnavailable,
} from "../../server/lib/database-errors";
import { buildSite, insertNetwork } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

describe("database errors", () => {
  let networkId = "";
  let admin: SignedInPerson;
  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
  });

  it("when the driver's error is wrapped by the query builder, then its SQLSTATE is still read", async () => {
    const { db } = testApp().deps;
    const name = `Twice ${Date.now()}`;
    await db.insert(sites).values({
      networkId,
      name,
      address: "1 Test Row",
      timeZone: "UTC",
      latitude: 0,
      longitude: 0,
    });
    const error = await db
      .insert(sites)
      .values({
        networkId,
        name,
        address: "1 Test Row",
        timeZone: "UTC",
        latitude: 0,
        longitude: 0,
      })
      .then(() => null)
      .catch((caught: unknown) => caught);

    expect(error).not.toBeNull();
    expect(databaseCodeOf(error)).toBe("23505");
    expect(appErrorFromDatabase(error)?.status).toBe(409);
  });

  it("when a connection is refused or dropped, then it reads as unavailable with Retry-After, not a refused query", () => {
    const refused = Object.assign(new AggregateError([]), {
      errors: [
        Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5"), { code: "ECONNREFUSED" }),
      ],
    });
    const dropped = new Error("Connection terminated unexpectedly");
    const wrapped = Object.assign(new Error("Failed query: select 1"), { cause: dropped });
    const shutdown = Object.assign(new Error("terminating connection"), { code: "57P01" });

    for (const error of [refused, dropped, wrapped, shutdown]) {
      expect(isDatabaseUnavailable(error)).toBe(true);
      const mapped = appErrorFromDatabase(error);
      expect(mapped?.status).toBe(503);
      expect(mapped?.retryAfterSeconds).toBeGreaterThan(0);
    }
    expect(isDatabaseUnavailable(Object.assign(new Error("dup"), { code: "23505" }))).toBe(false);
    expect(appErrorFromDatabase(new Error("something else"))).toBeNull();
  });

  it("when the same site is created eight times in parallel, then one 201 and the rest 409, never 500", async () => {
    const body = buildSite({ name: `Parallel ${Date.now()}` });
    const responses = await Promise.all(
      Array.from({ length: 8 }, () =>
        api(undefined, { cookie: admin.cookie }).post("/api/sites").send(body),
      ),
    );
    const statuses = responses.map((r) => r.status).sort();

    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(7);
    for (const response of responses.filter((r) => r.status === 409))
      expect(response.body.error.code).toBe("conflict");
    const [row] = await testApp()
      .deps.db.select({ n: count() })
      .from(sites)
      .where(and(eq(sites.networkId, networkId), eq(sites.name, body.name)));
    expect(row!.n).toBe(1);
  });
});
