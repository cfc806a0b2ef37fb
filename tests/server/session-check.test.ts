import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { roleGrants } from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertSite } from "../factories/records";
import { api, createTestApp, testApp, type TestApp } from "../helpers/app";
import { signInAs } from "../helpers/auth";

describe("the session check every signed-in request makes", () => {
  let networkId = "";
  let siteId = "";
  let counted: TestApp;
  let queries = 0;

  beforeAll(async () => {
    networkId = (await insertNetwork(testApp().deps.db)).id;
    siteId = (await insertSite(testApp().deps.db, networkId)).id;
    // An app of its own whose connections count the statements they send to PostgreSQL.
    counted = createTestApp();
    counted.database.pool.on("connect", (client) => {
      const query = client.query.bind(client) as (...args: unknown[]) => unknown;
      (client as { query: unknown }).query = (...args: unknown[]) => {
        queries += 1;
        return query(...args);
      };
    });
  });
  afterAll(async () => {
    await counted.database.close();
  });

  it("when a signed-in person asks who they are, then the session, the person and their grants come in one query", async () => {
    const { user, cookie } = await signInAs(networkId, [
      { role: "auditor", siteId },
      { role: "committee_member", siteId: null },
    ]);
    await api(counted.app, { cookie }).get("/api/auth/me"); // the pool's first connection

    queries = 0;
    const response = await api(counted.app, { cookie }).get("/api/auth/me");

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      user: { id: user.id, email: user.email, name: user.displayName },
      roles: [
        { role: "auditor", siteId },
        { role: "committee_member", siteId: null },
      ],
    });
    expect(queries).toBe(1);
  });

  it("when a person has no grants, then they are still signed in with none", async () => {
    const { cookie } = await signInAs(networkId, []);
    const response = await api(counted.app, { cookie }).get("/api/auth/me");
    expect(response.status).toBe(200);
    expect(response.body.roles).toEqual([]);
  });

  it("when a person's grant at a site is removed, then their very next request there is refused", async () => {
    const { db } = testApp().deps;
    const { user, cookie } = await signInAs(networkId, [{ role: "auditor", siteId }]);
    expect((await api(counted.app, { cookie }).get(`/api/sites/${siteId}`)).status).toBe(200);

    await db
      .delete(roleGrants)
      .where(and(eq(roleGrants.userId, user.id), eq(roleGrants.siteId, siteId)));

    expect((await api(counted.app, { cookie }).get(`/api/sites/${siteId}`)).status).toBe(404);
    const me = await api(counted.app, { cookie }).get("/api/auth/me");
    expect(me.body.roles).toEqual([]);
  });

  it("when a person is given a grant, then their very next request may use it", async () => {
    const { db } = testApp().deps;
    const { user, cookie } = await signInAs(networkId, []);
    expect((await api(counted.app, { cookie }).get(`/api/sites/${siteId}`)).status).toBe(404);

    await insertGrant(db, user.id, "facilities_lead", siteId);

    expect((await api(counted.app, { cookie }).get(`/api/sites/${siteId}`)).status).toBe(200);
  });
});
