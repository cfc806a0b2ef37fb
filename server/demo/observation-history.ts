import { randomUUID } from "node:crypto";

import { and, eq, inArray, sql } from "drizzle-orm";

import { observationOutcome, type OutcomeRecord } from "@shared/calc/observation-outcome";
import { itemKeyForSpaceProblem } from "@shared/observations/space-problem-items";
import {
  observedZoneTypes,
  staffRoles,
  type BreachKind,
  type SpaceProblem,
  type StaffRole,
} from "@shared/schemas/observations";
import type { ZoneType } from "@shared/zones";

import type { Tx } from "../db/client";
import type { Env } from "../env";
import {
  observationBreaches,
  observationSteps,
  observations,
  sequenceSteps,
  sequenceVersions,
  spaces,
  users,
} from "../db/schema/index";
import { recordObservationFindings, type FailedItem } from "../modules/actions/actions.service";
import { checklistItemsOf, latestPublishedVersion } from "../modules/checklists/checklists.service";
import type { DemoSiteKey } from "./people";
import { mulberry32, pick } from "./random";

const day = 24 * 60 * 60 * 1000;
const system = { userId: null, requestId: "demo-data" };

/**
 * How each demo site's observations go: how many a week, how often a step is breached, and how
 * much coaching helps the next time the same staff code is observed. At Orchard coaching works
 * (breaches fall to a third); elsewhere it helps a little.
 */
const profiles: Record<DemoSiteKey, { perWeek: number; breach: number; coached: number }> = {
  general: { perWeek: 4, breach: 1, coached: 0.85 },
  orchard: { perWeek: 3, breach: 1.3, coached: 0.35 },
  wexley: { perWeek: 2, breach: 1.6, coached: 0.9 },
};

/** Removal of gloves and gown is where staff contaminate themselves most; the rest rarely. */
function breachChance(stepKey: string, handHygiene: boolean): number {
  if (/glove/.test(stepKey) && !/hand-hygiene/.test(stepKey)) return 0.16;
  if (/gown/.test(stepKey)) return 0.12;
  if (handHygiene) return 0.07;
  return 0.03;
}

const techniqueKinds: Record<"removal" | "hands" | "other", BreachKind[]> = {
  removal: ["touched_face_or_clean_clothing", "out_of_order", "item_dropped_or_wrong_container"],
  hands: ["hand_hygiene_missed"],
  other: ["out_of_order", "step_skipped", "assistant_needed"],
};

/** What about the space went wrong in each site's space-caused breach. */
const spaceProblemOf: Record<DemoSiteKey, SpaceProblem> = {
  general: "bin_full",
  orchard: "no_clean_dirty_separation",
  wexley: "no_hand_rub_within_reach",
};

interface Sequence {
  id: string;
  key: string;
  title: string;
  kind: "putting_on" | "removal";
  steps: { id: string; key: string; position: number; handHygiene: boolean }[];
}

/** About a year of observations at the demo sites' donning zones, doffing areas and anterooms. */
export async function createDemoObservationHistory(
  tx: Tx,
  env: Env,
  networkId: string,
  siteIds: Record<DemoSiteKey, string>,
  now = new Date(),
) {
  const random = mulberry32(20261203);
  const versions = await tx
    .select()
    .from(sequenceVersions)
    .where(
      and(eq(sequenceVersions.networkId, networkId), eq(sequenceVersions.status, "published")),
    );
  if (versions.length === 0) return { observations: 0 };
  const stepRows = await tx
    .select()
    .from(sequenceSteps)
    .where(
      inArray(
        sequenceSteps.versionId,
        versions.map((v) => v.id),
      ),
    );
  const sequences: Sequence[] = versions.map((version) => ({
    id: version.id,
    key: version.key,
    title: version.title,
    kind: version.kind,
    steps: stepRows
      .filter((step) => step.versionId === version.id)
      .sort((a, b) => a.position - b.position),
  }));
  const puttingOn = sequences.filter((s) => s.kind === "putting_on");
  // Mostly the standard removal; the enhanced one now and then.
  const removal = sequences
    .filter((s) => s.kind === "removal")
    .flatMap((s) => (s.key === "enhanced-removal" ? [s] : [s, s, s]));
  const observers = await tx
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(inArray(users.email, ["auditor@example.org", "auditor2@example.org"]));
  const observerOf = (site: DemoSiteKey) =>
    (site === "orchard" && random() < 0.4
      ? observers.find((o) => o.email === "auditor2@example.org")
      : observers.find((o) => o.email === "auditor@example.org"))!.id;

  const spaceRows = await tx
    .select({ id: spaces.id, siteId: spaces.siteId, zoneType: spaces.zoneType })
    .from(spaces)
    .where(
      and(
        inArray(spaces.siteId, Object.values(siteIds)),
        inArray(spaces.zoneType, [...observedZoneTypes]),
      ),
    );

  // A few breaches are caused by the space, seen in the last hours at a doffing area of each site:
  // they go through the phone's own finding path, joining the item's open action or opening one
  // (at the moment of recording, as the app would).
  const recordedAt = new Date(
    (await tx.execute<{ now: string }>(sql`select now()::text as now`)).rows[0]!.now,
  );
  const planned = (Object.keys(siteIds) as DemoSiteKey[]).flatMap((site) => {
    const space = spaceRows.find(
      (row) => row.siteId === siteIds[site] && row.zoneType === "doffing_area",
    );
    return space
      ? [
          {
            siteId: space.siteId,
            spaceId: space.id,
            problem: spaceProblemOf[site],
            at: recordedAt.getTime() - (20 + random() * 60) * 60 * 1000,
          },
        ]
      : [];
  });

  const rows: (typeof observations.$inferInsert)[] = [];
  const stepsOut: (typeof observationSteps.$inferInsert)[] = [];
  const breachesOut: (typeof observationBreaches.$inferInsert)[] = [];
  const spaceFindings: {
    observationId: string;
    siteId: string;
    spaceId: string;
    zoneType: ZoneType;
    at: Date;
    problem: SpaceProblem;
    title: string;
  }[] = [];

  for (const site of Object.keys(siteIds) as DemoSiteKey[]) {
    const profile = profiles[site];
    const siteSpaces = spaceRows.filter((s) => s.siteId === siteIds[site]);
    if (siteSpaces.length === 0) continue;
    const prefix = site.slice(0, 1).toUpperCase();
    const staff = Array.from({ length: 16 }, (_, n) => ({
      code: `${prefix}${String(1040 + n * 7)}`,
      role: n % 5 === 0 ? ("doctor" as StaffRole) : pick(staffRoles.slice(0, 3), random),
      coachedAt: null as number | null,
    }));
    for (let at = now.getTime() - 365 * day; ;) {
      at += (7 * day * (0.6 + random() * 0.8)) / profile.perWeek;
      // The year ends with the site's space-caused breach, if it has one left.
      const due =
        at >= now.getTime() - day ? planned.find((p) => p.siteId === siteIds[site]) : undefined;
      if (at >= now.getTime() - day && !due) break;
      if (due) {
        planned.splice(planned.indexOf(due), 1);
        at = due.at;
      }
      const space = due ? siteSpaces.find((s) => s.id === due.spaceId)! : pick(siteSpaces, random);
      const person = pick(staff, random);
      const sequence = pick(space.zoneType === "donning_zone" ? puttingOn : removal, random);
      if (!sequence) continue;
      const observationId = randomUUID();
      const finishedAt = new Date(at);
      const factor = profile.breach * (person.coachedAt !== null ? profile.coached : 1);
      const records: (OutcomeRecord & { breaches: (typeof observationBreaches.$inferInsert)[] })[] =
        [];
      for (const step of sequence.steps) {
        const breaches: (typeof observationBreaches.$inferInsert)[] = [];
        const spaceBreach =
          due &&
          !spaceFindings.some((f) => f.observationId === observationId) &&
          (due.problem === "no_hand_rub_within_reach"
            ? step.handHygiene
            : /glove|gown/.test(step.key));
        if (spaceBreach) {
          breaches.push({
            observationId,
            stepId: step.id,
            kind:
              due.problem === "no_hand_rub_within_reach"
                ? "hand_hygiene_missed"
                : "item_dropped_or_wrong_container",
            cause: "space",
            spaceProblem: due.problem,
            note: null,
          });
          spaceFindings.push({
            observationId,
            siteId: space.siteId,
            spaceId: space.id,
            zoneType: space.zoneType,
            at: finishedAt,
            problem: due.problem,
            title: sequence.title,
          });
        } else if (random() < breachChance(step.key, step.handHygiene) * factor) {
          const kinds = step.handHygiene
            ? techniqueKinds.hands
            : /glove|gown|mask|respirator|eye|face/.test(step.key)
              ? techniqueKinds.removal
              : techniqueKinds.other;
          breaches.push({
            observationId,
            stepId: step.id,
            kind: pick(kinds, random),
            cause: "technique",
            spaceProblem: null,
            note: null,
          });
        }
        records.push({ stepId: step.id, done: true, breaches });
      }
      const result = observationOutcome(sequence.steps, records);
      const coachingGiven = result.breachCount > 0 && random() < 0.85;
      if (coachingGiven) person.coachedAt = at;
      rows.push({
        id: observationId,
        siteId: space.siteId,
        spaceId: space.id,
        sequenceVersionId: sequence.id,
        observerId: observerOf(site),
        staffCode: person.code,
        staffRole: person.role,
        startedAt: new Date(at - (4 + random() * 6) * 60 * 1000),
        finishedAt,
        outcome: result.outcome,
        breachCount: result.breachCount,
        handHygienePerformed: result.handHygiene.performed,
        handHygieneExpected: result.handHygiene.expected,
        coachingGiven,
        coachingNote: coachingGiven ? "Went through the step again at the mirror." : null,
        precheck: [
          { key: "waste_not_overfull", ok: due?.problem !== "bin_full" },
          { key: "hand_rub_within_reach", ok: due?.problem !== "no_hand_rub_within_reach" },
          { key: "sides_marked", ok: due?.problem !== "no_clean_dirty_separation" },
        ],
        bodyHash: randomUUID().replace(/-/g, "") + randomUUID().replace(/-/g, ""),
      });
      for (const step of result.steps) stepsOut.push({ observationId, ...step });
      for (const record of records) breachesOut.push(...record.breaches);
    }
  }
  for (let i = 0; i < rows.length; i += 500)
    await tx.insert(observations).values(rows.slice(i, i + 500));
  for (let i = 0; i < stepsOut.length; i += 2000)
    await tx.insert(observationSteps).values(stepsOut.slice(i, i + 2000));
  if (breachesOut.length > 0)
    for (let i = 0; i < breachesOut.length; i += 1000)
      await tx.insert(observationBreaches).values(breachesOut.slice(i, i + 1000));

  // Space-caused breaches: findings against the space's matching checklist item, as on a phone.
  for (const finding of spaceFindings) {
    const key = itemKeyForSpaceProblem(finding.zoneType, finding.problem);
    if (!key) continue;
    const version = await latestPublishedVersion(tx, networkId, finding.zoneType);
    const item = version
      ? (await checklistItemsOf(tx, version.id)).find((i) => i.key === key)
      : null;
    if (!item) continue;
    const failed: FailedItem = {
      itemId: item.id,
      key,
      text: item.text,
      severity: item.severity,
      note: `Seen while observing "${finding.title}".`,
    };
    const { actionIds } = await recordObservationFindings(
      tx,
      env,
      { id: finding.observationId, siteId: finding.siteId, spaceId: finding.spaceId },
      [failed],
      system,
      recordedAt,
    );
    const actionId = actionIds.get(key);
    if (actionId)
      await tx
        .update(observationBreaches)
        .set({ actionId })
        .where(
          and(
            eq(observationBreaches.observationId, finding.observationId),
            eq(observationBreaches.cause, "space"),
          ),
        );
  }
  // An action opened here is logged at the database's clock (microseconds) but opened at the
  // app's (milliseconds): the demo gives the action the log's time, as its other histories agree.
  await tx.execute(sql`
    update corrective_actions ca set opened_at = cl.occurred_at
      from change_log cl
     where cl.entity_id = ca.id and cl.action = 'action.opened'
       and ca.opened_at = ${recordedAt.toISOString()}::timestamptz`);
  return { observations: rows.length, spaceCaused: spaceFindings.length };
}
