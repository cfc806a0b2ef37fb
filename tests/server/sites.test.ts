import { randomUUID } from "node:crypto";

import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { changeLog, sites } from "../../server/db/schema/index";
import { buildSite, insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

describe("sites", () => {
  let networkId = "";
  let admin: SignedInPerson;
  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
  });

  const counts = async () => {
    const { db } = testApp().deps;
    const [siteRows] = await db
      .select({ n: count() })
      .from(sites)
      .where(eq(sites.networkId, networkId));
    const [logRows] = await db.select({ n: count() }).from(changeLog);
    return { sites: siteRows!.n, changeLog: logRows!.n };
  };

  it("when a person holds roles at some sites, then the list holds those sites only", async () => {
    const { db } = testApp().deps;
    const [a, b] = [await insertSite(db, networkId), await insertSite(db, networkId)];
    await insertSite(db, networkId);
    const auditor = await signInAs(networkId, [
      { role: "auditor", siteId: a.id },
      { role: "facilities_lead", siteId: b.id },
      { role: "auditor", siteId: b.id },
    ]);

    const response = await api(undefined, { cookie: auditor.cookie }).get("/api/sites");

    expect(response.status).toBe(200);
    expect(response.body.sites.map((s: { id: string }) => s.id).sort()).toEqual(
      [a.id, b.id].sort(),
    );
    expect(Object.keys(response.body.sites[0]).sort()).toEqual([
      "address",
      "id",
      "latitude",
      "longitude",
      "name",
      "timeZone",
    ]);
  });

  it("when a network-wide administrator lists sites, then every site of their network and none of another", async () => {
    const { db } = testApp().deps;
    const other = await insertNetwork(db);
    const foreign = await insertSite(db, other.id);
    const mine = await insertSite(db, networkId);

    const response = await api(undefined, { cookie: admin.cookie }).get("/api/sites");
    const ids = response.body.sites.map((s: { id: string }) => s.id);

    expect(ids).toContain(mine.id);
    expect(ids).not.toContain(foreign.id);
    const foreignRead = await api(undefined, { cookie: admin.cookie }).get(
      `/api/sites/${foreign.id}`,
    );
    expect(foreignRead.status).toBe(404);
  });

  it("when an administrator adds a site, then it is stored and the change log records it in the same step", async () => {
    const body = buildSite({ name: "  Harbourside Annexe  ", timeZone: "America/Halifax" });
    const response = await api(undefined, { cookie: admin.cookie }).post("/api/sites").send(body);

    expect(response.status).toBe(201);
    expect(response.body.site).toMatchObject({
      name: "Harbourside Annexe",
      timeZone: "America/Halifax",
    });
    const { db } = testApp().deps;
    const [entry] = await db
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entity, "site"), eq(changeLog.entityId, response.body.site.id)));
    expect(entry).toMatchObject({
      action: "site.created",
      actorId: admin.user.id,
      siteId: response.body.site.id,
    });
    expect(entry!.requestId).toBe(response.headers["x-request-id"]);
  });

  it("when a site is changed, then before and after land in the change log with the reason", async () => {
    const { db } = testApp().deps;
    const site = await insertSite(db, networkId, { address: "Old Address 1" });
    const response = await api(undefined, { cookie: admin.cookie })
      .patch(`/api/sites/${site.id}`)
      .send({ address: "New Address 2", reason: "Main entrance moved" });

    expect(response.status).toBe(200);
    expect(response.body.site.address).toBe("New Address 2");
    const [entry] = await db.select().from(changeLog).where(eq(changeLog.entityId, site.id));
    expect(entry).toMatchObject({
      action: "site.updated",
      reason: "Main entrance moved",
      before: expect.objectContaining({ address: "Old Address 1" }),
      after: expect.objectContaining({ address: "New Address 2" }),
    });
  });

  it("when the name is already used in the network, then 409 naming the field and nothing changes", async () => {
    const { db } = testApp().deps;
    const existing = await insertSite(db, networkId);
    const before = await counts();
    const response = await api(undefined, { cookie: admin.cookie })
      .post("/api/sites")
      .send(buildSite({ name: existing.name }));
    expect(response.status).toBe(409);
    expect(response.body.error.fields).toHaveProperty("name");
    expect(await counts()).toEqual(before);
  });

  describe("bad input never writes and never answers 500", () => {
    const createCases: [string, unknown, string][] = [
      ["a missing field", { ...buildSite(), name: undefined }, "name"],
      ["an extra field", { ...buildSite(), colour: "teal" }, "colour"],
      ["a wrong type", { ...buildSite(), latitude: "fifty" }, "latitude"],
      ["an out-of-range number", { ...buildSite(), longitude: 181 }, "longitude"],
      ["an over-long string", { ...buildSite(), address: "x".repeat(301) }, "address"],
      ["a blank string", { ...buildSite(), name: "   " }, "name"],
      ["a time zone that is not IANA", { ...buildSite(), timeZone: "GMT+1" }, "timeZone"],
      ["an abbreviation for a time zone", { ...buildSite(), timeZone: "Mars/Olympus" }, "timeZone"],
      ["an array instead of an object", [buildSite()], "body"],
    ];
    for (const [what, body, field] of createCases) {
      it(`when creating with ${what}, then 400 names ${field} and nothing is written`, async () => {
        const before = await counts();
        const response = await api(undefined, { cookie: admin.cookie })
          .post("/api/sites")
          .send(body as object);
        expect(response.status).toBe(400);
        expect(response.body.error.code).toBe("validation_failed");
        expect(response.body.error.fields).toHaveProperty(field);
        expect(await counts()).toEqual(before);
      });
    }

    it("when the JSON is malformed, then 400 and nothing is written", async () => {
      const before = await counts();
      const response = await api(undefined, { cookie: admin.cookie })
        .post("/api/sites")
        .set("Content-Type", "application/json")
        .send("{ name: 'no quotes' }");
      expect(response.status).toBe(400);
      expect(response.body.error.fields).toHaveProperty("body");
      expect(await counts()).toEqual(before);
    });

    it("when the body is too large, then 413 in the envelope", async () => {
      const response = await api(undefined, { cookie: admin.cookie })
        .post("/api/sites")
        .send({ ...buildSite(), address: "x".repeat(200_000) });
      expect(response.status).toBe(413);
      expect(response.body.error.code).toBe("payload_too_large");
    });

    it("when a change names no field, then 400 and the site is unchanged", async () => {
      const site = await insertSite(testApp().deps.db, networkId);
      const response = await api(undefined, { cookie: admin.cookie })
        .patch(`/api/sites/${site.id}`)
        .send({ reason: "nothing" });
      expect(response.status).toBe(400);
    });

    it("when the site id is not an id, then 400 naming siteId", async () => {
      const response = await api(undefined, { cookie: admin.cookie }).get("/api/sites/not-an-id");
      expect(response.status).toBe(400);
      expect(response.body.error.fields).toHaveProperty("siteId");
    });

    it("when the site id is unknown, then 404 for reads and changes, and nothing is written", async () => {
      const before = await counts();
      const id = randomUUID();
      expect((await api(undefined, { cookie: admin.cookie }).get(`/api/sites/${id}`)).status).toBe(
        404,
      );
      const change = await api(undefined, { cookie: admin.cookie })
        .patch(`/api/sites/${id}`)
        .send({ name: "Ghost" });
      expect(change.status).toBe(404);
      expect(change.body.error.code).toBe("not_found");
      expect(await counts()).toEqual(before);
    });

    it("when a change has a bad field next to good ones, then nothing of it is saved", async () => {
      const { db } = testApp().deps;
      const site = await insertSite(db, networkId, { name: `Keep ${randomUUID().slice(0, 6)}` });
      const response = await api(undefined, { cookie: admin.cookie })
        .patch(`/api/sites/${site.id}`)
        .send({ name: "Changed name", latitude: 123 });
      expect(response.status).toBe(400);
      expect(response.body.error.fields).toEqual({ latitude: "Between -90 and 90." });
      const [row] = await db.select().from(sites).where(eq(sites.id, site.id));
      expect(row!.name).toBe(site.name);
    });
  });
});
