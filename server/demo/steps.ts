import { eq } from "drizzle-orm";

import type { ConstructionClass } from "@shared/zones";

import { hashPassword } from "../auth/password";
import { networks, roleGrants, sites, users } from "../db/schema/index";
import { recordChange } from "../lib/change-log";
import { ensureDefaultChecklists } from "../modules/checklists/checklists.service";
import { ensureDefaultSequences } from "../modules/observations/sequences.service";
import { createDemoAuditHistory } from "./audit-history";
import { createDemoCorrectiveActions } from "./corrective-actions";
import { createDemoObservationHistory } from "./observation-history";
import { createDemoIdentityProvider } from "./identity-provider";
import { createDemoFloor, type DemoFloorPlan } from "./floor-plans";
import { createDemoPressureMonitors } from "./pressure-monitors";
import { demoNetworkName, demoPassword, demoPeople, demoSites, type DemoSiteKey } from "./people";
import type { Tx } from "../db/client";
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

const suitesAt = (
  count: number,
  constructionClass: ConstructionClass,
  first: number,
): DemoFloorPlan["suites"] =>
  Array.from({ length: count }, (_, index) => ({
    number: String(first + index),
    top: index % 2 === 0,
    x: 50 + Math.floor(index / 2) * 300,
    constructionClass,
  }));

const demoFloors: Record<DemoSiteKey, DemoFloorPlan[]> = {
  general: [
    {
      building: "Main block",
      level: 1,
      name: "Ward 1 — Respiratory",
      suites: suitesAt(3, "new_or_renovated", 101),
    },
    {
      building: "Main block",
      level: 2,
      name: "Ward 2 — Medical",
      suites: suitesAt(3, "existing", 201),
    },
    {
      building: "Main block",
      level: 3,
      name: "Ward 3 — Surgical",
      suites: suitesAt(2, "existing", 301),
    },
    {
      building: "Main block",
      level: 4,
      name: "Ward 4 — High dependency",
      suites: suitesAt(2, "new_or_renovated", 401),
    },
  ],
  orchard: [
    {
      building: "East wing",
      level: 0,
      name: "Ground floor — Acute assessment",
      suites: suitesAt(2, "existing", 11),
    },
    {
      building: "East wing",
      level: 1,
      name: "First floor — Inpatients",
      suites: suitesAt(2, "existing", 21),
    },
  ],
  wexley: [
    {
      building: "Rehab unit",
      level: 0,
      name: "Ground floor",
      suites: suitesAt(2, "new_or_renovated", 1),
      corridorBay: true,
    },
  ],
};

/** The demo network and the ids of those of its sites that exist, by key. */
async function findDemoSites(tx: Tx) {
  const [network] = await tx
    .select({ id: networks.id })
    .from(networks)
    .where(eq(networks.name, demoNetworkName));
  if (!network) return null;
  const siteRows = await tx
    .select({ id: sites.id, name: sites.name })
    .from(sites)
    .where(eq(sites.networkId, network.id));
  const siteIds: Partial<Record<DemoSiteKey, string>> = {};
  for (const key of Object.keys(demoSites) as DemoSiteKey[]) {
    const site = siteRows.find((row) => row.name === demoSites[key].name);
    if (site) siteIds[key] = site.id;
  }
  return { networkId: network.id, siteIds };
}

const hasEverySite = (
  siteIds: Partial<Record<DemoSiteKey, string>>,
): siteIds is Record<DemoSiteKey, string> =>
  (Object.keys(demoSites) as DemoSiteKey[]).every((key) => siteIds[key] !== undefined);

const floorPlans: DemoStep = {
  id: "2026-12-02-floor-plans-spaces-fixtures",
  description: "floor plans with isolation suites and fixtures for the three sites",
  async run(tx, context) {
    const demo = await findDemoSites(tx);
    if (!demo) return;
    for (const [key, plans] of Object.entries(demoFloors) as [DemoSiteKey, DemoFloorPlan[]][]) {
      const siteId = demo.siteIds[key];
      if (!siteId) continue;
      for (const plan of plans) await createDemoFloor(tx, context.storage, siteId, plan);
    }
  },
};

const auditHistory: DemoStep = {
  id: "2026-12-02-audit-history",
  description: "default checklists and about a year of audits at every demo space",
  async run(tx) {
    const demo = await findDemoSites(tx);
    if (!demo) return;
    await createDemoAuditHistory(tx, demo.networkId, demo.siteIds as Record<DemoSiteKey, string>);
  },
};

const correctiveActionsHistory: DemoStep = {
  id: "2026-12-02-corrective-actions",
  description:
    "findings and corrective actions from the audit history, with a year of work on them",
  async run(tx, context) {
    const demo = await findDemoSites(tx);
    if (!demo || !hasEverySite(demo.siteIds)) return;
    await createDemoCorrectiveActions(tx, context.storage, demo.siteIds);
  },
};

const checklistDefaultsV2: DemoStep = {
  id: "2026-12-03-checklist-defaults-v2",
  description: "version 2 of the default checklists, published over the unedited version 1",
  async run(tx) {
    const demo = await findDemoSites(tx);
    if (!demo) return;
    await ensureDefaultChecklists(tx, demo.networkId);
  },
};

const sequenceDefaults: DemoStep = {
  id: "2026-12-03-sequence-defaults",
  description: "Lintel's default putting-on and removal sequences, published as version 1",
  async run(tx) {
    const demo = await findDemoSites(tx);
    if (!demo) return;
    await ensureDefaultSequences(tx, demo.networkId);
  },
};

const observationHistory: DemoStep = {
  id: "2026-12-03-observation-history",
  description:
    "a year of observed putting-on and removal at the three sites, a few breaches caused by the space",
  async run(tx, context) {
    const demo = await findDemoSites(tx);
    if (!demo || !hasEverySite(demo.siteIds)) return;
    await createDemoObservationHistory(tx, context.env, demo.networkId, demo.siteIds);
  },
};

const demoIdentityProvider: DemoStep = {
  id: "2026-12-03-demo-identity-provider",
  description: "Tamsin Bay Health's own (local, demo) identity provider for example.org",
  async run(tx, context) {
    const demo = await findDemoSites(tx);
    const local = context.identityProvider;
    if (!demo || !local) return;
    await createDemoIdentityProvider(tx, context.env, demo.networkId, local);
  },
};

const pressureMonitorsStep: DemoStep = {
  id: "2026-12-03-pressure-monitors",
  description: "a room-pressure monitor mapped to every demo isolation room",
  async run(tx) {
    const demo = await findDemoSites(tx);
    if (!demo || !hasEverySite(demo.siteIds)) return;
    await createDemoPressureMonitors(tx, demo.siteIds);
  },
};

/** In release order; append new steps, never reorder or rename released ones. */
export const demoStepList: DemoStep[] = [
  networkSitesPeople,
  floorPlans,
  auditHistory,
  correctiveActionsHistory,
  checklistDefaultsV2,
  sequenceDefaults,
  observationHistory,
  demoIdentityProvider,
  pressureMonitorsStep,
];
