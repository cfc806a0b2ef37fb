import { hashPassword } from "../auth/password";
import { networks, roleGrants, sites, users } from "../db/schema/index";
import { recordChange } from "../lib/change-log";
import { demoNetworkName, demoPassword, demoPeople, demoSites, type DemoSiteKey } from "./people";
import type { DemoStep } from "./run-demo-steps";

const system = { userId: null, requestId: "demo-data" };

const networkSitesPeople: DemoStep = {
  id: "2026-12-02-network-sites-people",
  description: "Tamsin Bay Health: three sites and eight people",
  async run(tx) {
    const [network] = await tx
      .insert(networks)
      .values({ name: demoNetworkName })
      .returning({ id: networks.id });
    const siteIds = {} as Record<DemoSiteKey, string>;
    for (const [key, site] of Object.entries(demoSites) as [
      DemoSiteKey,
      (typeof demoSites)[DemoSiteKey],
    ][]) {
      const [row] = await tx
        .insert(sites)
        .values({ networkId: network!.id, ...site })
        .returning({ id: sites.id });
      siteIds[key] = row!.id;
      await recordChange(tx, system, {
        action: "site.created",
        entity: "site",
        entityId: row!.id,
        siteId: row!.id,
        after: site,
      });
    }
    for (const person of demoPeople) {
      const passwordHash = await hashPassword(demoPassword);
      const [user] = await tx
        .insert(users)
        .values({
          networkId: network!.id,
          email: person.email,
          displayName: person.name,
          passwordHash,
        })
        .returning({ id: users.id });
      await recordChange(tx, system, {
        action: "user.created",
        entity: "user",
        entityId: user!.id,
        siteId: null,
        after: { email: person.email, name: person.name },
      });
      for (const grant of person.grants) {
        const siteId = grant.site === null ? null : siteIds[grant.site];
        await tx.insert(roleGrants).values({ userId: user!.id, role: grant.role, siteId });
        await recordChange(tx, system, {
          action: "role.granted",
          entity: "user",
          entityId: user!.id,
          siteId,
          after: { role: grant.role, siteId },
        });
      }
    }
  },
};

/** In release order; append new steps, never reorder or rename released ones. */
export const demoStepList: DemoStep[] = [networkSitesPeople];
