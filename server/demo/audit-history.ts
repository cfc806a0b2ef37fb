import { randomUUID } from "node:crypto";

import { eq, inArray } from "drizzle-orm";

import {
  type JudgedAnswer,
  type Outcome,
  type Severity,
  readinessOf,
  rulesVersion,
  scoreOf,
} from "@shared/calc/verdict";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import type { Tx } from "../db/client";
import { auditAnswers, audits, spaces, users } from "../db/schema/index";
import {
  checklistItemsOf,
  ensureDefaultChecklists,
  latestPublishedVersion,
} from "../modules/checklists/checklists.service";
import type { DemoSiteKey } from "./people";
import { mulberry32 } from "./random";

/** How each demo site behaves: how often items fail, whether it improves, how often audits slip. */
const profiles: Record<
  DemoSiteKey,
  { fail: Record<Severity, number>; improving: number; skip: number }
> = {
  general: { fail: { critical: 0.015, major: 0.05, minor: 0.09 }, improving: 0, skip: 0.05 },
  orchard: { fail: { critical: 0.05, major: 0.12, minor: 0.16 }, improving: 0.6, skip: 0.1 },
  wexley: { fail: { critical: 0.07, major: 0.15, minor: 0.2 }, improving: -0.3, skip: 0.25 },
};

const cadence: Record<ZoneType, number> = {
  isolation_room: 7,
  anteroom: 30,
  donning_zone: 30,
  doffing_area: 30,
};
const day = 24 * 60 * 60 * 1000;

function reading(item: ChecklistItem, pass: boolean, random: () => number, minimumAch: number) {
  switch (item.quantity) {
    case "pressure":
      return { value: pass ? -(3 + random() * 9) : -(0.5 + random() * 1.8), unit: "Pa" };
    case "airflow":
      return { value: 900 + random() * 600, unit: "m3/h" };
    case "air_changes":
      return {
        value: pass ? minimumAch + random() * 4 : minimumAch * (0.5 + random() * 0.4),
        unit: "ach",
      };
    case "percent":
      return { value: pass ? 62 + random() * 18 : 40 + random() * 15, unit: "percent" };
    default:
      return { value: random() * 10, unit: "min" };
  }
}

/** About a year of audits for every demo space, on each space's cadence, with a mix of verdicts. */
export async function createDemoAuditHistory(
  tx: Tx,
  networkId: string,
  siteIds: Record<DemoSiteKey, string>,
  now = new Date(),
) {
  // The year of history was audited on version 1 of the defaults; a later step brings version 2.
  await ensureDefaultChecklists(tx, networkId, 1);
  const random = mulberry32(20261202);
  // One after another: a transaction's connection takes one statement at a time.
  const idOf = async (email: string) =>
    (await tx.select({ id: users.id }).from(users).where(eq(users.email, email)))[0]!.id;
  const auditor = await idOf("auditor@example.org");
  const auditor2 = await idOf("auditor2@example.org");
  const versions = new Map<ZoneType, { id: string; items: ChecklistItem[] }>();
  for (const zoneType of Object.keys(cadence) as ZoneType[]) {
    const version = (await latestPublishedVersion(tx, networkId, zoneType))!;
    versions.set(zoneType, { id: version.id, items: await checklistItemsOf(tx, version.id) });
  }

  const siteKeys = Object.fromEntries(
    Object.entries(siteIds).map(([key, id]) => [id, key as DemoSiteKey]),
  );
  const spaceRows = await tx
    .select({
      id: spaces.id,
      siteId: spaces.siteId,
      zoneType: spaces.zoneType,
      constructionClass: spaces.constructionClass,
    })
    .from(spaces)
    .where(inArray(spaces.siteId, Object.values(siteIds)));

  const auditRows: (typeof audits.$inferInsert)[] = [];
  const answerRows: (typeof auditAnswers.$inferInsert)[] = [];
  for (const space of spaceRows) {
    const profile = profiles[siteKeys[space.siteId]!];
    const version = versions.get(space.zoneType)!;
    const every = cadence[space.zoneType];
    const minimumAch = space.constructionClass === "new_or_renovated" ? 12 : 6;
    // Start a year back, offset per space so audits do not all fall on one day.
    for (
      let at = now.getTime() - 365 * day + random() * every * day;
      at < now.getTime() - day;
      at += every * day * (0.85 + random() * 0.3)
    ) {
      if (random() < profile.skip) continue;
      // 0 at the start of the year, 1 now: improving sites fail less as the year goes on.
      const progress = 1 - (now.getTime() - at) / (365 * day);
      const trend = Math.max(0.2, 1 - profile.improving * (progress - 0.5) * 2);
      const auditId = randomUUID();
      const outcomes: JudgedAnswer[] = [];
      for (const item of version.items) {
        const outcome: Outcome =
          random() < 0.03 && item.severity !== "critical"
            ? "not_applicable"
            : random() < profile.fail[item.severity] * trend
              ? "fail"
              : "pass";
        outcomes.push({ key: item.key, text: item.text, severity: item.severity, outcome });
        const row: typeof auditAnswers.$inferInsert = {
          id: randomUUID(),
          auditId,
          itemId: item.id,
          outcome,
        };
        if (item.response === "reading" && outcome !== "not_applicable") {
          const read = reading(item, outcome === "pass", random, minimumAch);
          // Demo readings are entered in the stored unit, so the entered value is the stored one.
          Object.assign(row, { ...read, enteredValue: read.value });
        }
        if (item.response === "count" && outcome !== "not_applicable")
          row.count = outcome === "pass" ? 2 + Math.floor(random() * 2) : 1;
        if (item.response === "choice" && outcome !== "not_applicable")
          row.choice = item.choices!.find((c) => c.passes === (outcome === "pass"))!.value;
        if (outcome === "fail") row.note = "Found during the walkthrough.";
        answerRows.push(row);
      }
      const submittedAt = new Date(at + (20 + random() * 40) * 60 * 1000);
      const readiness = readinessOf(space.zoneType, outcomes);
      auditRows.push({
        id: auditId,
        siteId: space.siteId,
        spaceId: space.id,
        checklistVersionId: version.id,
        auditorId: siteKeys[space.siteId] === "orchard" && random() < 0.4 ? auditor2! : auditor!,
        status: "submitted",
        startedAt: new Date(at),
        submittedAt,
        verdict: readiness.verdict,
        verdictReasons: readiness.reasons,
        rulesVersion,
        score: scoreOf(outcomes),
      });
    }
  }
  for (let i = 0; i < auditRows.length; i += 500)
    await tx.insert(audits).values(auditRows.slice(i, i + 500));
  for (let i = 0; i < answerRows.length; i += 2000)
    await tx.insert(auditAnswers).values(answerRows.slice(i, i + 2000));
  return { audits: auditRows.length, answers: answerRows.length };
}
