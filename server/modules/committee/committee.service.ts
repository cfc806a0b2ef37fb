import { sql } from "drizzle-orm";

import { itemCategories, categoryOfItem } from "@shared/checklists/categories";
import {
  monthsOf,
  networkTally,
  observationFigures as figuresOf,
  type SiteObservationTally,
} from "@shared/calc/observation-stats";
import { committeeConfidence, proportion } from "@shared/calc/proportion";
import { pChart, proportionDifferenceInterval } from "@shared/calc/statistics";
import type { Outcome, Verdict } from "@shared/calc/verdict";
import type { RoleGrant } from "@shared/roles";
import {
  ageBuckets,
  minimumRankedSample,
  type CommitteeQuery,
  type ComparisonResponse,
  type SiteDrillDown,
  type TrendsResponse,
} from "@shared/schemas/committee";
import { minimumStaffCodes, type ObservationCommitteeResponse } from "@shared/schemas/observations";
import type { ZoneType } from "@shared/zones";

import type { Database, DbOrTx } from "../../db/client";
import { AppError } from "../../lib/app-error";
import { listSitesFor, networkName } from "../sites/sites.service";
import * as repo from "./committee.repository";

const confidence = committeeConfidence;

/** The sites the person may read, in name order. */
export async function readableSites(db: Database, networkId: string, grants: readonly RoleGrant[]) {
  // Retired sites stay in the figures: their audits happened.
  return (await listSitesFor(db, networkId, grants, { includeRetired: true })).map((site) => ({
    id: site.id,
    name: site.name,
  }));
}

/** The site ids a person's grants limit them to, or null when a network-wide grant covers all. */
export function grantedSiteIds(grants: readonly RoleGrant[]): string[] | null {
  if (grants.some((grant) => grant.siteId === null)) return null;
  return [...new Set(grants.flatMap((grant) => (grant.siteId ? [grant.siteId] : [])))];
}

type ComparisonSite = ComparisonResponse["sites"][number];

/**
 * A site's item groups with answers, in the groups' own order, from the statement's
 * `[group, applicable, passed]` entries. Written as plain loops and object literals of one shape:
 * this runs for every site and group of every comparison, and the reply is built for each call.
 */
function groupProportions(groups: repo.ComparisonRow["groups"]): ComparisonSite["categories"] {
  const out: ComparisonSite["categories"] = [];
  for (const category of itemCategories) {
    for (const [group, applicable, passed] of groups) {
      if (group !== category || applicable <= 0) continue;
      const share = proportion(passed, applicable);
      out.push({
        category,
        n: share.n,
        successes: share.successes,
        rate: share.rate,
        interval: share.interval,
        smallSample: share.smallSample,
      });
      break;
    }
  }
  return out;
}

export async function comparison(
  db: Database,
  networkId: string,
  grants: readonly RoleGrant[],
  query: CommitteeQuery,
): Promise<ComparisonResponse> {
  // One round trip: the readable sites, the network's name and both sets of counts together.
  const found = await repo.comparisonRows(db, networkId, grantedSiteIds(grants), query);
  const name = found[0]?.network_name ?? (await networkName(db, networkId));
  const rows: ComparisonSite[] = found.map((row) => ({
    siteId: row.site_id,
    siteName: row.site_name,
    readiness: proportion(row.all_clear, row.audits),
    verdicts: { all_clear: row.all_clear, gaps_to_fix: row.gaps_to_fix, hold: row.hold },
    categories: groupProportions(row.groups),
    rank: null,
  }));
  // Only sites with enough audits are ranked; the others keep their interval and a flag.
  const ranked = rows
    .filter((row) => !row.readiness.smallSample)
    .sort((a, b) => b.readiness.rate! - a.readiness.rate!);
  ranked.forEach((row, index) => {
    row.rank = index + 1;
  });
  const total = rows.reduce((sum, row) => sum + row.readiness.n, 0);
  const ready = rows.reduce((sum, row) => sum + row.readiness.successes, 0);

  let difference: ComparisonResponse["difference"] = null;
  if (query.siteA && query.siteB) {
    const a = rows.find((row) => row.siteId === query.siteA);
    const b = rows.find((row) => row.siteId === query.siteB);
    if (!a || !b) {
      const field = a ? "siteB" : "siteA";
      throw new AppError("validation_failed", 400, "Choose two sites you can read.", {
        fields: { [field]: "Not one of the sites you can read." },
      });
    }
    if (a.readiness.n > 0 && b.readiness.n > 0) {
      const interval = proportionDifferenceInterval(
        a.readiness.successes,
        a.readiness.n,
        b.readiness.successes,
        b.readiness.n,
        confidence,
      );
      difference = {
        siteA: a.siteId,
        siteB: b.siteId,
        difference: a.readiness.rate! - b.readiness.rate!,
        interval,
        excludesZero: interval.lower > 0 || interval.upper < 0,
      };
    }
  }
  return {
    networkName: name,
    from: query.from,
    to: query.to,
    zoneType: query.zoneType ?? null,
    confidence,
    minimumRankedSample,
    network: proportion(ready, total),
    sites: rows,
    difference,
  };
}

const emptyBuckets = () =>
  Object.fromEntries(ageBuckets.map((bucket) => [bucket, 0])) as Record<
    (typeof ageBuckets)[number],
    number
  >;

export async function trends(
  db: Database,
  networkId: string,
  grants: readonly RoleGrant[],
  query: CommitteeQuery,
): Promise<TrendsResponse> {
  const sites = await readableSites(db, networkId, grants);
  const ids = sites.map((site) => site.id);
  const [months, aging, closes] = await Promise.all([
    repo.readinessByMonth(db, ids, query),
    repo.actionAging(db, ids, query.zoneType),
    repo.closeTimes(db, ids, query),
  ]);
  return {
    from: query.from,
    to: query.to,
    zoneType: query.zoneType ?? null,
    sites: sites.map((site) => {
      // Months without audits are absent from the rollup query, so they are left out of the chart.
      const own = months.filter((row) => row.site_id === site.id);
      if (own.length === 0)
        return { siteId: site.id, siteName: site.name, centre: null, points: [] };
      const chart = pChart(own.map((row) => ({ defects: row.all_clear, n: row.audits })));
      return {
        siteId: site.id,
        siteName: site.name,
        centre: chart.centre,
        points: chart.points.map((point, index) => ({
          month: own[index]!.month,
          audits: own[index]!.audits,
          allClear: own[index]!.all_clear,
          ...point,
        })),
      };
    }),
    aging: sites.map((site) => {
      const pick = (rows: typeof aging.unfinished) => {
        const row = rows.find((candidate) => candidate.site_id === site.id);
        const buckets = emptyBuckets();
        for (const bucket of ageBuckets) buckets[bucket] = row?.[bucket] ?? 0;
        return buckets;
      };
      return {
        siteId: site.id,
        siteName: site.name,
        unfinished: pick(aging.unfinished),
        overdue: pick(aging.overdue),
      };
    }),
    closeTimes: closes
      .map((row) => ({
        siteId: row.site_id,
        siteName: sites.find((site) => site.id === row.site_id)!.name,
        severity: row.severity,
        closed: row.closed,
        medianDays: Math.round(Number(row.median_days) * 10) / 10,
      }))
      .sort(
        (a, b) =>
          a.siteName.localeCompare(b.siteName) ||
          ["critical", "major", "minor"].indexOf(a.severity) -
            ["critical", "major", "minor"].indexOf(b.severity),
      ),
  };
}

export async function siteDrillDown(
  db: Database,
  siteId: string,
  siteName: string,
  query: CommitteeQuery,
): Promise<SiteDrillDown> {
  const rows = await repo.spacesOfSite(db, siteId, query);
  return {
    siteId,
    siteName,
    from: query.from,
    to: query.to,
    spaces: rows.map((row) => ({
      spaceId: row.space_id,
      spaceName: row.space_name,
      zoneType: row.zone_type,
      floorId: row.floor_id,
      floorName: row.floor_name,
      readiness: proportion(row.all_clear, row.audits),
      lastVerdict: row.last_verdict,
      lastAuditAt: row.last_audit_at ? new Date(row.last_audit_at).toISOString() : null,
      unfinishedActions: row.unfinished_actions,
      overdueActions: row.overdue_actions,
    })),
  };
}

/** Answer counts by item group, for the monthly totals. */
function answerCounts(answers: readonly { key: string; outcome: Outcome | null }[], sign: 1 | -1) {
  const byCategory = new Map<string, { applicable: number; passed: number }>();
  for (const answer of answers) {
    if (answer.outcome !== "pass" && answer.outcome !== "fail") continue;
    const category = categoryOfItem(answer.key);
    const counts = byCategory.get(category) ?? { applicable: 0, passed: 0 };
    counts.applicable += sign;
    if (answer.outcome === "pass") counts.passed += sign;
    byCategory.set(category, counts);
  }
  return [...byCategory].map(([category, counts]) => ({ category, ...counts }));
}

/** Counts a submitted audit into its site's month; call in the submit's transaction. */
export async function countSubmittedAudit(
  tx: DbOrTx,
  audit: {
    siteId: string;
    zoneType: ZoneType;
    submittedAt: Date;
    verdict: Verdict;
    answers: readonly { key: string; outcome: Outcome | null }[];
  },
) {
  const where = { siteId: audit.siteId, zoneType: audit.zoneType, at: audit.submittedAt };
  await repo.addAuditCounts(tx, { ...where, delta: repo.verdictDelta(audit.verdict, 1) });
  await repo.addAnswerCounts(tx, { ...where, counts: answerCounts(audit.answers, 1) });
}

/** Moves an amended answer and verdict from their old counts to their new ones. */
export async function countAmendment(
  tx: DbOrTx,
  change: {
    siteId: string;
    zoneType: ZoneType;
    submittedAt: Date;
    verdictBefore: Verdict | null;
    verdictAfter: Verdict;
    key: string;
    outcomeBefore: Outcome | null;
    outcomeAfter: Outcome;
  },
) {
  const where = { siteId: change.siteId, zoneType: change.zoneType, at: change.submittedAt };
  if (change.verdictBefore && change.verdictBefore !== change.verdictAfter) {
    const out = repo.verdictDelta(change.verdictBefore, -1, 0);
    const into = repo.verdictDelta(change.verdictAfter, 1, 0);
    await repo.addAuditCounts(tx, {
      ...where,
      delta: {
        audits: 0,
        allClear: out.allClear + into.allClear,
        gapsToFix: out.gapsToFix + into.gapsToFix,
        hold: out.hold + into.hold,
      },
    });
  }
  const removed = answerCounts([{ key: change.key, outcome: change.outcomeBefore }], -1);
  const added = answerCounts([{ key: change.key, outcome: change.outcomeAfter }], 1);
  const merged = new Map<string, { applicable: number; passed: number }>();
  for (const row of [...removed, ...added]) {
    const counts = merged.get(row.category) ?? { applicable: 0, passed: 0 };
    counts.applicable += row.applicable;
    counts.passed += row.passed;
    merged.set(row.category, counts);
  }
  await repo.addAnswerCounts(tx, {
    ...where,
    counts: [...merged].map(([category, counts]) => ({ category, ...counts })),
  });
}

/**
 * At start-up: the item groups into the database, and monthly totals counted once for a database
 * whose audits predate them.
 */
export async function prepareMonthStats(db: Database) {
  await repo.syncItemCategories(db);
  await db.transaction(async (tx) => {
    await tx.execute(sqlLock);
    if (await repo.hasMonthStats(tx)) return;
    await repo.rebuildMonthStats(tx, await repo.sitesWithSubmittedAudits(tx));
  });
}

const sqlLock = sql`select pg_advisory_xact_lock(hashtext('lintel-month-stats'))`;

export const rebuildMonthStats = repo.rebuildMonthStats;

/** The overdue actions a report lists, most overdue first (at most 200). */
export const overdueForReport = (db: Database, siteIds: readonly string[]) =>
  repo.overdueActions(db, siteIds, 200);

/** The committee's figures on observed putting-on and removal, per readable site and in all. */
export async function observationFigures(
  db: Database,
  networkId: string,
  grants: readonly RoleGrant[],
  query: Pick<CommitteeQuery, "from" | "to">,
): Promise<ObservationCommitteeResponse> {
  const found = await repo.observationFigureRows(db, networkId, grantedSiteIds(grants), query);
  const tallies = new Map<string, SiteObservationTally>();
  for (const site of found.sites)
    tallies.set(site.site_id, {
      observations: site.observations,
      staffCodes: site.staff_codes,
      withoutCode: site.without_code,
      steps: [],
      handHygiene: {
        observations: site.hh_observations,
        allMoments: site.hh_all,
        performed: site.hh_performed,
        expected: site.hh_expected,
        staffCodes: site.hh_staff_codes,
        withoutCode: site.hh_without_code,
      },
      perMonth: [],
      afterCoaching: { staffCodes: site.coached, clean: site.coached_clean },
    });
  for (const row of found.steps)
    tallies.get(row.site_id)?.steps.push({
      sequenceKey: row.sequence_key,
      sequenceTitle: row.sequence_title,
      stepKey: row.step_key,
      stepText: row.step_text,
      position: row.position,
      observations: row.observations,
      breached: row.breached,
      staffCodes: row.staff_codes,
      withoutCode: row.without_code,
    });
  for (const row of found.months)
    tallies.get(row.site_id)?.perMonth.push({ month: row.month, observations: row.observations });
  const months = monthsOf(query.from, query.to);
  return {
    from: query.from,
    to: query.to,
    confidence,
    minimumRankedSample,
    minimumStaffCodes,
    network: figuresOf(networkTally([...tallies.values()]), months),
    sites: found.sites.map((site) => ({
      siteId: site.site_id,
      siteName: site.site_name,
      ...figuresOf(tallies.get(site.site_id)!, months),
    })),
  };
}
