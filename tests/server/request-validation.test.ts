import { count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { sites } from "../../server/db/schema/index";
import { insertFloor, insertSpace } from "../factories/audits";
import { buildSite, insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

describe("request validation", () => {
  let networkId = "";
  let admin: SignedInPerson;
  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
  });
  const siteCount = async () => {
    const [row] = await testApp()
      .deps.db.select({ n: count() })
      .from(sites)
      .where(eq(sites.networkId, networkId));
    return row!.n;
  };

  it("when a site name holds NUL, then 400 names the name field and no site is made", async () => {
    const before = await siteCount();
    const response = await api(undefined, { cookie: admin.cookie })
      .post("/api/sites")
      .send(buildSite({ name: "Ward\u0000 block" }));
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.fields).toEqual({
      name: "Remove the invisible or control character at position 5; it cannot be stored.",
    });
    expect(await siteCount()).toBe(before);
  });

  it("when a query value holds NUL, then 400 names the query field", async () => {
    const response = await api(undefined, { cookie: admin.cookie }).get(
      "/api/committee/comparison?from=2026-01%00&to=2026-02",
    );
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(Object.keys(response.body.error.fields)).toContain("from");
  });

  for (const key of ["__proto__", "constructor", "toString", "hasOwnProperty"]) {
    it(`when a body carries the key ${key}, then 400 names it as an unknown field`, async () => {
      const site = await insertSite(testApp().deps.db, networkId);
      // Written as text: an object literal's __proto__ would set the prototype, not a key.
      const raw = `{"address":"3 Test Row","${key}":{"polluted":true}}`;
      const response = await api(undefined, { cookie: admin.cookie })
        .patch(`/api/sites/${site.id}`)
        .set("Content-Type", "application/json")
        .send(raw);
      expect(response.status, JSON.stringify(response.body)).toBe(400);
      expect(response.body.error.message).toBe(`Check these fields: ${key}.`);
      expect(Object.keys(response.body.error.fields)).toEqual([key]);
      expect(response.body.error.fields[key]).toBe("Unknown field.");
    });
  }

  it("when a nested object carries a __proto__ key, then 400 names its path", async () => {
    const site = await insertSite(testApp().deps.db, networkId);
    const raw =
      '{"critical":{"amount":1,"unit":"hours","__proto__":{"x":1}},"major":{"amount":2,"unit":"days"},"minor":{"amount":3,"unit":"days"}}';
    const response = await api(undefined, { cookie: admin.cookie })
      .put(`/api/sites/${site.id}/due-policy`)
      .set("Content-Type", "application/json")
      .send(raw);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.fields).toEqual({ "critical.__proto__": "Unknown field." });
  });

  it("when a new audit's space is not an id, then 400 names spaceId (not a 404 for an unknown site)", async () => {
    const { db } = testApp().deps;
    const site = await insertSite(db, networkId);
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId: site.id }]);
    for (const spaceId of ["not-an-id", 12345, null]) {
      const response = await api(undefined, { cookie: auditor.cookie })
        .put(`/api/audits/${crypto.randomUUID()}`)
        .send({ spaceId, startedAt: new Date().toISOString() });
      expect(response.status, JSON.stringify(response.body)).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(["spaceId"]);
    }
    const space = await insertSpace(db, await insertFloor(db, site.id));
    const elsewhere = await signInAs(networkId, []);
    const hidden = await api(undefined, { cookie: elsewhere.cookie })
      .put(`/api/audits/${crypto.randomUUID()}`)
      .send({ spaceId: space.id, startedAt: new Date().toISOString() });
    expect(hidden.status).toBe(404);
  });
});
