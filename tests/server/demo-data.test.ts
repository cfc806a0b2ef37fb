import { count, eq, inArray, min } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import {
  audits,
  demoSteps,
  networks,
  roleGrants,
  sites,
  users,
} from "../../server/db/schema/index";
import { demoPassword, demoPeople } from "../../server/demo/people";
import { runDemoSteps, type DemoStep } from "../../server/demo/run-demo-steps";
import { demoStepList } from "../../server/demo/steps";
import { api, testApp } from "../helpers/app";

describe("demo data", () => {
  it("when the steps run twice (even at once), then each runs once and is recorded", async () => {
    const { db, logger, storage } = testApp().deps;
    const [first, second] = await Promise.all([
      runDemoSteps(db, logger, demoStepList, { storage }),
      runDemoSteps(db, logger, demoStepList, { storage }),
    ]);
    const third = await runDemoSteps(db, logger, demoStepList, { storage });

    expect([...first, ...second].sort()).toEqual(demoStepList.map((step) => step.id).sort());
    expect(third).toEqual([]);
    const recorded = await db.select().from(demoSteps);
    expect(recorded.map((row) => row.id)).toEqual(
      expect.arrayContaining(demoStepList.map((step) => step.id)),
    );
    const [tamsin] = await db
      .select({ n: count() })
      .from(networks)
      .where(eq(networks.name, "Tamsin Bay Health"));
    expect(tamsin!.n).toBe(1);

    const emails = demoPeople.map((person) => person.email);
    const people = await db
      .select({ id: users.id })
      .from(users)
      .where(inArray(users.email, emails));
    expect(people).toHaveLength(8);
    const grants = await db
      .select()
      .from(roleGrants)
      .where(
        inArray(
          roleGrants.userId,
          people.map((p) => p.id),
        ),
      );
    expect(grants).toHaveLength(demoPeople.reduce((n, person) => n + person.grants.length, 0));
  });

  it("when a later release adds a step, then only the new step runs on an existing database", async () => {
    const { db, logger, storage } = testApp().deps;
    await runDemoSteps(db, logger, demoStepList, { storage });
    let ran = 0;
    const later: DemoStep = {
      id: `test-later-step-${crypto.randomUUID()}`,
      description: "a later step",
      run: async () => void (ran += 1),
    };
    expect(await runDemoSteps(db, logger, [...demoStepList, later], { storage })).toEqual([
      later.id,
    ]);
    expect(await runDemoSteps(db, logger, [...demoStepList, later], { storage })).toEqual([]);
    expect(ran).toBe(1);
  });

  it("when each demo person signs in with the demo password, then they get the roles the README lists", async () => {
    const { db, logger, storage } = testApp().deps;
    await runDemoSteps(db, logger, demoStepList, { storage });
    for (const person of demoPeople) {
      const response = await api()
        .post("/api/auth/sign-in")
        .send({ email: person.email, password: demoPassword });
      expect(response.status, person.email).toBe(200);
      expect(response.body.roles.map((grant: { role: string }) => grant.role).sort()).toEqual(
        person.grants.map((grant) => grant.role).sort(),
      );
      const networkWide = response.body.roles.filter(
        (grant: { siteId: string | null }) => grant.siteId === null,
      );
      expect(networkWide.length, person.email).toBe(
        person.grants.filter((grant) => grant.site === null).length,
      );
    }
  });

  it("when a demo person signs in with the demo password, then they get their roles", async () => {
    const { db, logger, storage } = testApp().deps;
    await runDemoSteps(db, logger, demoStepList, { storage });
    const response = await api()
      .post("/api/auth/sign-in")
      .send({ email: "auditor2@example.org", password: demoPassword });
    expect(response.status).toBe(200);
    expect(response.body.roles).toEqual([{ role: "auditor", siteId: expect.any(String) }]);
    const cookie = String(response.headers["set-cookie"]?.[0]).split(";")[0];
    const sites = await api(undefined, { cookie }).get("/api/sites");
    expect(sites.body.sites.map((s: { name: string }) => s.name)).toEqual([
      "Orchard Hill Community Hospital",
    ]);
  });

  it("when the demo history is loaded, then each site has about a year of audits with every verdict", async () => {
    const { db, logger, storage } = testApp().deps;
    await runDemoSteps(db, logger, demoStepList, { storage });
    const rows = await db
      .select({
        site: sites.name,
        verdict: audits.verdict,
        n: count(),
        first: min(audits.submittedAt),
      })
      .from(audits)
      .innerJoin(sites, eq(sites.id, audits.siteId))
      .innerJoin(networks, eq(networks.id, sites.networkId))
      .where(eq(networks.name, "Tamsin Bay Health"))
      .groupBy(sites.name, audits.verdict);
    for (const site of [
      "Tamsin Bay General Hospital",
      "Orchard Hill Community Hospital",
      "Wexley Rehabilitation Centre",
    ]) {
      const mine = rows.filter((row) => row.site === site);
      expect(mine.map((row) => row.verdict).sort(), site).toEqual([
        "not_ready",
        "ready",
        "ready_with_conditions",
      ]);
      const earliest = Math.min(...mine.map((row) => row.first!.getTime()));
      expect(Date.now() - earliest, site).toBeGreaterThan(300 * 24 * 60 * 60 * 1000);
    }
  });
});
