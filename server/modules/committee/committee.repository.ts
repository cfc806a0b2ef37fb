import { type SQL, sql } from "drizzle-orm";

import { categorisedKeys } from "@shared/checklists/categories";
import type { Severity, Verdict } from "@shared/calc/verdict";
import type { ActionState } from "@shared/workflow/action-workflow";
import type { ZoneType } from "@shared/zones";

import type { Database, DbOrTx } from "../../db/client";

/** The first day of `month` (YYYY-MM) as a date literal. */
const firstDay = (month: string) => `${month}-01`;

export interface Period {
  from: string;
  to: string;
  zoneType?: ZoneType;
}

const zoneFilter = (zoneType: ZoneType | undefined, column = sql.raw("zone_type")) =>
  zoneType ? sql`and ${column} = ${zoneType}` : sql``;

/** Joins the action's space only when a zone type narrows the figures. */
const zoneJoin = (zoneType: ZoneType | undefined) =>
  zoneType ? sql`join spaces sp on sp.id = ca.space_id and sp.zone_type = ${zoneType}` : sql``;

const siteArray = (siteIds: readonly string[]) => sql`${`{${siteIds.join(",")}}`}::uuid[]`;

/** Writes the shared item groups into the database, for SQL that groups answers. */
export async function syncItemCategories(db: DbOrTx) {
  if (categorisedKeys.length === 0) return;
  const values = sql.join(
    categorisedKeys.map(([key, category]) => sql`(${key}, ${category})`),
    sql`, `,
  );
  await db.execute(sql`
    insert into item_category_keys (key, category) values ${values}
    on conflict (key) do update set category = excluded.category`);
}

export interface VerdictDelta {
  audits: number;
  allClear: number;
  gapsToFix: number;
  hold: number;
}

export function verdictDelta(verdict: Verdict, sign: 1 | -1, counted: 0 | 1 = 1): VerdictDelta {
  return {
    audits: sign * counted,
    allClear: verdict === "all_clear" ? sign : 0,
    gapsToFix: verdict === "gaps_to_fix" ? sign : 0,
    hold: verdict === "hold" ? sign : 0,
  };
}

/** Adds to a site's month (on the site's clock) the audit counts in `delta`. */
export async function addAuditCounts(
  db: DbOrTx,
  input: { siteId: string; zoneType: ZoneType; at: Date; delta: VerdictDelta },
) {
  const { audits, allClear, gapsToFix, hold } = input.delta;
  await db.execute(sql`
    insert into audit_month_stats (site_id, zone_type, month, audits, all_clear, gaps_to_fix, hold)
    select s.id, ${input.zoneType}, date_trunc('month', ${input.at.toISOString()}::timestamptz at time zone s.time_zone)::date,
           ${audits}, ${allClear}, ${gapsToFix}, ${hold}
      from sites s where s.id = ${input.siteId}
    on conflict (site_id, zone_type, month) do update set
      audits = audit_month_stats.audits + excluded.audits,
      all_clear = audit_month_stats.all_clear + excluded.all_clear,
      gaps_to_fix = audit_month_stats.gaps_to_fix + excluded.gaps_to_fix,
      hold = audit_month_stats.hold + excluded.hold`);
}

/** Adds answer counts by item group to a site's month. */
export async function addAnswerCounts(
  db: DbOrTx,
  input: {
    siteId: string;
    zoneType: ZoneType;
    at: Date;
    counts: { category: string; applicable: number; passed: number }[];
  },
) {
  if (input.counts.length === 0) return;
  const values = sql.join(
    input.counts.map(
      (row) => sql`(${row.category}::varchar, ${row.applicable}::int, ${row.passed}::int)`,
    ),
    sql`, `,
  );
  await db.execute(sql`
    insert into answer_month_stats (site_id, zone_type, month, category, applicable, passed)
    select s.id, ${input.zoneType}, date_trunc('month', ${input.at.toISOString()}::timestamptz at time zone s.time_zone)::date,
           v.category, v.applicable, v.passed
      from sites s, (values ${values}) as v(category, applicable, passed)
     where s.id = ${input.siteId}
    on conflict (site_id, zone_type, month, category) do update set
      applicable = answer_month_stats.applicable + excluded.applicable,
      passed = answer_month_stats.passed + excluded.passed`);
}

/** Recounts the monthly totals of the given sites from their audits (demo data, benchmarks). */
export async function rebuildMonthStats(db: DbOrTx, siteIds: readonly string[]) {
  if (siteIds.length === 0) return;
  const ids = siteArray(siteIds);
  await db.execute(sql`delete from audit_month_stats where site_id = any(${ids})`);
  await db.execute(sql`delete from answer_month_stats where site_id = any(${ids})`);
  await db.execute(sql`
    insert into audit_month_stats (site_id, zone_type, month, audits, all_clear, gaps_to_fix, hold)
    select a.site_id, sp.zone_type, date_trunc('month', a.submitted_at at time zone s.time_zone)::date,
           count(*), count(*) filter (where a.verdict = 'all_clear'),
           count(*) filter (where a.verdict = 'gaps_to_fix'),
           count(*) filter (where a.verdict = 'hold')
      from audits a
      join spaces sp on sp.id = a.space_id
      join sites s on s.id = a.site_id
     where a.status = 'submitted' and a.site_id = any(${ids})
     group by 1, 2, 3`);
  await db.execute(sql`
    insert into answer_month_stats (site_id, zone_type, month, category, applicable, passed)
    select a.site_id, sp.zone_type, date_trunc('month', a.submitted_at at time zone s.time_zone)::date,
           coalesce(k.category, 'other'),
           count(*) filter (where aa.outcome in ('pass', 'fail')),
           count(*) filter (where aa.outcome = 'pass')
      from audits a
      join audit_answers aa on aa.audit_id = a.id
      join checklist_items ci on ci.id = aa.item_id
      left join item_category_keys k on k.key = ci.key
      join spaces sp on sp.id = a.space_id
      join sites s on s.id = a.site_id
     where a.status = 'submitted' and a.site_id = any(${ids})
     group by 1, 2, 3, 4`);
}

export async function hasMonthStats(db: DbOrTx) {
  const result = await db.execute<{ any: boolean }>(
    sql`select exists (select 1 from audit_month_stats) as any`,
  );
  return result.rows[0]?.any ?? false;
}

export async function sitesWithSubmittedAudits(db: DbOrTx) {
  const result = await db.execute<{ site_id: string }>(
    sql`select distinct site_id from audits where status = 'submitted'`,
  );
  return result.rows.map((row) => row.site_id);
}

/** Counts actions by age in days since `from`, in the four buckets, per site. */
const agedBuckets = (from: "opened_at" | "due_at", where: SQL) => sql`
    select site_id,
           count(*) filter (where age <= 7)::int as "0-7",
           count(*) filter (where age > 7 and age <= 30)::int as "8-30",
           count(*) filter (where age > 30 and age <= 90)::int as "31-90",
           count(*) filter (where age > 90)::int as "90+"
      from (select ca.site_id, extract(epoch from (now() - ca.${sql.raw(from)})) / 86400 as age
              ${where}) aged
     group by site_id`;

/**
 * The aggregates behind the comparison and the trends, as SQL of their own so the benchmark can
 * time exactly these statements in psql beside the endpoints that run them.
 */
export const committeeQueries = {
  /**
   * The comparison in one statement: the sites the person may read (every site of the network
   * for a network-wide grant, else `onlyIds`; retired ones too, since their audits happened), the
   * network's name, each site's audit counts and its answer counts by item group as one JSON array
   * of `[group, applicable, passed]`, one row per site in site-name order (40 rows for 40 sites, not
   * one per site and group: the driver reads each row's fields one by one, a JSON column at once).
   */
  comparison: (networkId: string, onlyIds: readonly string[] | null, period: Period) => {
    // A few granted sites are read through the index by id; a whole network by joining its sites.
    const scope =
      onlyIds === null
        ? sql`site_id in (select id from readable)`
        : sql`site_id = any(${siteArray(onlyIds)})`;
    return sql`
    with readable as (
      select id, name from sites
       where network_id = ${networkId}
         ${onlyIds === null ? sql`` : sql`and id = any(${siteArray(onlyIds)})`}
    ), readiness as (
      select site_id, sum(audits)::int as audits, sum(all_clear)::int as all_clear,
             sum(gaps_to_fix)::int as gaps_to_fix, sum(hold)::int as hold
        from audit_month_stats
       where ${scope}
         and month between ${firstDay(period.from)}::date and ${firstDay(period.to)}::date
         ${zoneFilter(period.zoneType)}
       group by site_id
    ), categories as (
      select site_id, json_agg(json_build_array(category, applicable, passed)) as groups
        from (
          select site_id, category, sum(applicable)::int as applicable, sum(passed)::int as passed
            from answer_month_stats
           where ${scope}
             and month between ${firstDay(period.from)}::date and ${firstDay(period.to)}::date
             ${zoneFilter(period.zoneType)}
           group by site_id, category
        ) by_group
       group by site_id
    )
    select r.id as site_id, r.name as site_name,
           (select name from networks where id = ${networkId}) as network_name,
           coalesce(a.audits, 0) as audits, coalesce(a.all_clear, 0) as all_clear,
           coalesce(a.gaps_to_fix, 0) as gaps_to_fix, coalesce(a.hold, 0) as hold,
           coalesce(c.groups, '[]'::json) as groups
      from readable r
      left join readiness a on a.site_id = r.id
      left join categories c on c.site_id = r.id
     order by r.name, r.id`;
  },
  readinessByMonth: (siteIds: readonly string[], period: Period) => sql`
    select site_id, to_char(month, 'YYYY-MM') as month, sum(audits)::int as audits,
           sum(all_clear)::int as all_clear
      from audit_month_stats
     where site_id = any(${siteArray(siteIds)})
       and month between ${firstDay(period.from)}::date and ${firstDay(period.to)}::date
       ${zoneFilter(period.zoneType)}
     group by site_id, month
    having sum(audits) > 0
     order by site_id, month`,
  agingUnfinished: (siteIds: readonly string[], zoneType?: ZoneType) =>
    agedBuckets(
      "opened_at",
      sql`from corrective_actions ca ${zoneJoin(zoneType)}
          where ca.site_id = any(${siteArray(siteIds)}) and ca.state <> 'done'`,
    ),
  agingOverdue: (siteIds: readonly string[], zoneType?: ZoneType) =>
    agedBuckets(
      "due_at",
      sql`from corrective_actions ca ${zoneJoin(zoneType)}
          where ca.site_id = any(${siteArray(siteIds)}) and ca.state <> 'done'
            and ca.due_at < now()`,
    ),
  // The period's bounds are worked out once per site (its own clock), not once per action.
  closeTimes: (siteIds: readonly string[], period: Period) => sql`
    with bounds as (
      select s.id,
             (${firstDay(period.from)}::date::timestamp at time zone s.time_zone) as starts,
             ((${firstDay(period.to)}::date + interval '1 month')::timestamp at time zone s.time_zone) as ends
        from sites s where s.id = any(${siteArray(siteIds)})
    )
    select ca.site_id, ca.severity, count(*)::int as closed,
           percentile_cont(0.5) within group (order by ca.days_to_close) as median_days
      from bounds b
      join corrective_actions ca
        on ca.site_id = b.id and ca.closed_at >= b.starts and ca.closed_at < b.ends
      ${zoneJoin(period.zoneType)}
     where ca.state = 'done' and ca.close_reason is distinct from 'space_retired'
     group by ca.site_id, ca.severity`,
};

export type ComparisonRow = {
  site_id: string;
  site_name: string;
  network_name: string | null;
  audits: number;
  all_clear: number;
  gaps_to_fix: number;
  hold: number;
  /** Each item group with answers: `[group, applicable, passed]`. */
  groups: [string, number, number][];
};

export async function comparisonRows(
  db: DbOrTx,
  networkId: string,
  onlyIds: readonly string[] | null,
  period: Period,
) {
  const result = await db.execute<ComparisonRow>(
    committeeQueries.comparison(networkId, onlyIds, period),
  );
  return result.rows;
}

export async function readinessByMonth(db: DbOrTx, siteIds: readonly string[], period: Period) {
  const result = await db.execute<{
    site_id: string;
    month: string;
    audits: number;
    all_clear: number;
  }>(committeeQueries.readinessByMonth(siteIds, period));
  return result.rows;
}

type Buckets = { "0-7": number; "8-30": number; "31-90": number; "90+": number };

/** Unfinished actions aged since opening, and overdue ones since their due time, as of now. */
export async function actionAging(db: DbOrTx, siteIds: readonly string[], zoneType?: ZoneType) {
  const [unfinished, overdue] = await Promise.all([
    db.execute<Buckets & { site_id: string }>(committeeQueries.agingUnfinished(siteIds, zoneType)),
    db.execute<Buckets & { site_id: string }>(committeeQueries.agingOverdue(siteIds, zoneType)),
  ]);
  return { unfinished: unfinished.rows, overdue: overdue.rows };
}

/** Median days to close by site and severity, for actions closed within the period. */
export async function closeTimes(db: DbOrTx, siteIds: readonly string[], period: Period) {
  const result = await db.execute<{
    site_id: string;
    severity: Severity;
    closed: number;
    median_days: number;
  }>(committeeQueries.closeTimes(siteIds, period));
  return result.rows;
}

/** Each space of a site with its audits in the period, its latest verdict and its open work. */
export async function spacesOfSite(db: DbOrTx, siteId: string, period: Period) {
  const zone = period.zoneType ? sql`and sp.zone_type = ${period.zoneType}` : sql``;
  const result = await db.execute<{
    space_id: string;
    space_name: string;
    zone_type: ZoneType;
    floor_id: string;
    floor_name: string;
    audits: number;
    all_clear: number;
    last_verdict: Verdict | null;
    last_audit_at: Date | null;
    unfinished_actions: number;
    overdue_actions: number;
  }>(sql`
    with bounds as (
      select (${firstDay(period.from)}::date::timestamp at time zone s.time_zone) as starts,
             ((${firstDay(period.to)}::date + interval '1 month')::timestamp at time zone s.time_zone) as ends
        from sites s where s.id = ${siteId}
    )
    select sp.id as space_id, sp.name as space_name, sp.zone_type, f.id as floor_id,
           f.name as floor_name,
           coalesce(stats.audits, 0)::int as audits, coalesce(stats.all_clear, 0)::int as all_clear,
           latest.verdict as last_verdict, latest.submitted_at as last_audit_at,
           coalesce(work.unfinished_actions, 0)::int as unfinished_actions,
           coalesce(work.overdue_actions, 0)::int as overdue_actions
      from spaces sp
      join floors f on f.id = sp.floor_id
      cross join bounds
      left join lateral (
        select count(*) as audits, count(*) filter (where a.verdict = 'all_clear') as all_clear
          from audits a
         where a.space_id = sp.id and a.status = 'submitted'
           and a.submitted_at >= bounds.starts and a.submitted_at < bounds.ends
      ) stats on true
      left join lateral (
        select a.verdict, a.submitted_at from audits a
         where a.space_id = sp.id and a.status = 'submitted' and a.submitted_at is not null
         order by a.submitted_at desc limit 1
      ) latest on true
      left join lateral (
        select count(*) as unfinished_actions, count(*) filter (where ca.due_at < now()) as overdue_actions
          from corrective_actions ca where ca.space_id = sp.id and ca.state <> 'done'
      ) work on true
     where sp.site_id = ${siteId} ${zone}
     order by f.level, f.name, sp.name`);
  return result.rows;
}

export type AuditExportRow = {
  id: string;
  site_name: string;
  floor_name: string;
  space_name: string;
  zone_type: ZoneType;
  auditor_name: string;
  submitted_at: Date;
  verdict: Verdict;
  score: number | null;
  time_zone: string;
};

/**
 * Every submitted audit in the period, oldest first, handed over in batches from one cursor, so
 * the database sorts once and memory stays flat however many audits the period holds.
 */
export async function exportAuditRows(
  db: Database,
  siteIds: readonly string[],
  period: Period,
  batch: (rows: AuditExportRow[]) => Promise<void>,
  size = 2000,
) {
  const zone = period.zoneType ? sql`and sp.zone_type = ${period.zoneType}` : sql``;
  await db.transaction(async (tx) => {
    await tx.execute(sql`declare audit_export no scroll cursor for
        with bounds as (
      select s.id, s.name, s.time_zone,
             (${firstDay(period.from)}::date::timestamp at time zone s.time_zone) as starts,
             ((${firstDay(period.to)}::date + interval '1 month')::timestamp at time zone s.time_zone) as ends
        from sites s where s.id = any(${siteArray(siteIds)})
    )
    select a.id, b.name as site_name, f.name as floor_name, sp.name as space_name, sp.zone_type,
           u.display_name as auditor_name, a.submitted_at, a.verdict, a.score, b.time_zone
      from audits a
      join bounds b on b.id = a.site_id
      join spaces sp on sp.id = a.space_id
      join floors f on f.id = sp.floor_id
      join users u on u.id = a.auditor_id
     where a.status = 'submitted'
       and a.submitted_at >= (select min(starts) from bounds)
       and a.submitted_at >= b.starts and a.submitted_at < b.ends
       ${zone}
     order by a.submitted_at, a.id
`);
    for (;;) {
      const result = await tx.execute<AuditExportRow>(sql.raw(`fetch ${size} from audit_export`));
      if (result.rows.length === 0) break;
      await batch(result.rows.map((row) => ({ ...row, submitted_at: new Date(row.submitted_at) })));
    }
  });
}

/** Overdue unfinished actions at the sites, most overdue first (for the report). */
export async function overdueActions(db: DbOrTx, siteIds: readonly string[], limit: number) {
  const result = await db.execute<{
    id: string;
    site_name: string;
    space_name: string;
    title: string;
    severity: Severity;
    state: ActionState;
    due_at: Date;
    owner: string | null;
    time_zone: string;
  }>(sql`
    select ca.id, s.name as site_name, sp.name as space_name, ca.title, ca.severity, ca.state,
           ca.due_at, u.display_name as owner, s.time_zone
      from corrective_actions ca
      join sites s on s.id = ca.site_id
      join spaces sp on sp.id = ca.space_id
      left join users u on u.id = ca.assignee_id
     where ca.site_id = any(${siteArray(siteIds)}) and ca.state <> 'done' and ca.due_at < now()
     order by ca.due_at
     limit ${limit}`);
  return result.rows.map((row) => ({ ...row, due_at: new Date(row.due_at) }));
}

/**
 * The committee's observation counts in one statement, one row of four JSON lists: the sites the
 * person may read (as for the comparison), each site's totals and hand-hygiene counts, its counts
 * per sequence step, its observations per month (on its own clock), and its staff codes coached
 * then observed again. Observations past retention have no staff code: they count everywhere but
 * in the distinct codes and the after-coaching pairs. No staff code leaves this statement.
 */
export const observationQueries = {
  figures: (networkId: string, onlyIds: readonly string[] | null, period: Period) => sql`
    with readable as (
      select id, name,
             (${firstDay(period.from)}::date::timestamp at time zone time_zone) as starts,
             ((${firstDay(period.to)}::date + interval '1 month')::timestamp at time zone time_zone) as ends,
             time_zone
        from sites
       where network_id = ${networkId}
         ${onlyIds === null ? sql`` : sql`and id = any(${siteArray(onlyIds)})`}
    ), obs as (
      select o.id, o.site_id, o.staff_code, o.finished_at, o.outcome, o.coaching_given,
             o.breach_count, o.hand_hygiene_performed as performed,
             o.hand_hygiene_expected as expected,
             o.sequence_version_id,
             to_char(o.finished_at at time zone r.time_zone, 'YYYY-MM') as month
        from readable r
        join observations o on o.site_id = r.id and o.finished_at >= r.starts and o.finished_at < r.ends
    ), totals as (
      -- Distinct staff codes counted as groups (one hashing pass) rather than sorted per site.
      select site_id, sum(observations)::int as observations,
             count(staff_code)::int as staff_codes,
             coalesce(sum(observations) filter (where staff_code is null), 0)::int as without_code,
             sum(hh_observations)::int as hh_observations,
             sum(hh_all)::int as hh_all,
             sum(hh_performed)::int as hh_performed,
             sum(hh_expected)::int as hh_expected,
             count(staff_code) filter (where hh_observations > 0)::int as hh_staff_codes,
             coalesce(sum(hh_observations) filter (where staff_code is null), 0)::int as hh_without_code
        from (select site_id, staff_code, count(*) as observations,
                     count(*) filter (where expected > 0) as hh_observations,
                     count(*) filter (where expected > 0 and performed >= expected) as hh_all,
                     coalesce(sum(performed) filter (where expected > 0), 0) as hh_performed,
                     coalesce(sum(expected), 0) as hh_expected
                from obs group by site_id, staff_code) per_code
       group by site_id
    ), step_names as materialized (
      -- Each step's words and place as in the newest version of its sequence that was observed.
      select distinct on (sv.key, ss.key) sv.key as sequence_key, sv.title as sequence_title,
             ss.key as step_key, ss.text as step_text, ss.position
        from sequence_versions sv
        join sequence_steps ss on ss.version_id = sv.id
       where sv.id in (select distinct sequence_version_id from obs)
       order by sv.key, ss.key, sv.version desc
    ), step_counts as (
      -- Every observation answers every step of its version (an observation missing one is
      -- refused), so a step's observations are its version's; only breached steps are read one by
      -- one, and only for the observations with a breach.
      select v.site_id, ss.id as step_id, v.observations, coalesce(b.breached, 0) as breached
        from (select site_id, sequence_version_id, count(*)::int as observations
                from obs group by site_id, sequence_version_id) v
        join sequence_steps ss on ss.version_id = v.sequence_version_id
        left join (select obs.site_id, os.step_id, count(*)::int as breached
                     from obs
                     join observation_steps os on os.observation_id = obs.id and os.breached
                    where obs.breach_count > 0
                    group by obs.site_id, os.step_id) b
               on b.site_id = v.site_id and b.step_id = ss.id
    ), step_totals as materialized (
      select sc.site_id, sv.key as sequence_key, ss.key as step_key,
             sum(sc.observations)::int as observations, sum(sc.breached)::int as breached
        from step_counts sc
        join sequence_steps ss on ss.id = sc.step_id
        join sequence_versions sv on sv.id = ss.version_id
       group by sc.site_id, sv.key, ss.key
    ), step_people as materialized (
      -- Who each step's figure describes: every observation answers every step of its version,
      -- so a step's staff codes are those of the observations of the versions that have it
      -- (grouped by code first, then counted: no sort of every code at every step).
      select site_id, sequence_key, step_key,
             count(staff_code)::int as staff_codes, sum(without_code)::int as without_code
        from (select p.site_id, sv.key as sequence_key, ss.key as step_key, p.staff_code,
                     sum(p.without_code) as without_code
                from (select site_id, sequence_version_id, staff_code,
                             count(*) filter (where staff_code is null) as without_code
                        from obs group by site_id, sequence_version_id, staff_code) p
                join sequence_versions sv on sv.id = p.sequence_version_id
                join sequence_steps ss on ss.version_id = p.sequence_version_id
               group by p.site_id, sv.key, ss.key, p.staff_code) per_code
       group by site_id, sequence_key, step_key
    ), months as (
      select site_id, month, count(*)::int as observations from obs group by site_id, month
    ), followed as (
      select site_id, staff_code, coaching_given, finished_at, id,
             lead(outcome) over (partition by site_id, staff_code order by finished_at, id) as next_outcome
        from obs where staff_code is not null
    ), first_coaching as (
      -- One per staff code: the first coaching in the period that another observation followed.
      select distinct on (site_id, staff_code) site_id, next_outcome
        from followed
       where coaching_given and next_outcome is not null
       order by site_id, staff_code, finished_at, id
    ), coached as (
      select site_id, count(*)::int as staff_codes,
             count(*) filter (where next_outcome = 'clean_run')::int as clean
        from first_coaching group by site_id
    )
    select
      (select coalesce(json_agg(json_build_object(
                'site_id', r.id, 'site_name', r.name,
                'observations', coalesce(t.observations, 0),
                'staff_codes', coalesce(t.staff_codes, 0),
                'without_code', coalesce(t.without_code, 0),
                'hh_observations', coalesce(t.hh_observations, 0),
                'hh_all', coalesce(t.hh_all, 0),
                'hh_performed', coalesce(t.hh_performed, 0),
                'hh_expected', coalesce(t.hh_expected, 0),
                'hh_staff_codes', coalesce(t.hh_staff_codes, 0),
                'hh_without_code', coalesce(t.hh_without_code, 0),
                'coached', coalesce(c.staff_codes, 0),
                'coached_clean', coalesce(c.clean, 0)) order by r.name, r.id), '[]')
         from readable r
         left join totals t on t.site_id = r.id
         left join coached c on c.site_id = r.id) as sites,
      (select coalesce(json_agg(json_build_object(
                'site_id', sc.site_id, 'sequence_key', sc.sequence_key,
                'sequence_title', n.sequence_title, 'step_key', sc.step_key,
                'step_text', n.step_text, 'position', n.position,
                'observations', sc.observations, 'breached', sc.breached,
                'staff_codes', sp.staff_codes, 'without_code', sp.without_code)), '[]')
         from step_totals sc
         join step_people sp on sp.site_id = sc.site_id and sp.sequence_key = sc.sequence_key
                            and sp.step_key = sc.step_key
         join step_names n on n.sequence_key = sc.sequence_key and n.step_key = sc.step_key) as steps,
      (select coalesce(json_agg(json_build_object(
                'site_id', site_id, 'month', month, 'observations', observations)), '[]')
         from months) as months`,
};

export interface ObservationSiteRow {
  site_id: string;
  site_name: string;
  observations: number;
  staff_codes: number;
  without_code: number;
  hh_observations: number;
  hh_all: number;
  hh_performed: number;
  hh_expected: number;
  hh_staff_codes: number;
  hh_without_code: number;
  coached: number;
  coached_clean: number;
}

export interface ObservationStepRow {
  site_id: string;
  sequence_key: string;
  sequence_title: string;
  step_key: string;
  step_text: string;
  position: number;
  observations: number;
  breached: number;
  staff_codes: number;
  without_code: number;
}

export async function observationFigureRows(
  db: DbOrTx,
  networkId: string,
  onlyIds: readonly string[] | null,
  period: Period,
) {
  const result = await db.execute<{
    sites: ObservationSiteRow[];
    steps: ObservationStepRow[];
    months: { site_id: string; month: string; observations: number }[];
  }>(observationQueries.figures(networkId, onlyIds, period));
  return result.rows[0]!;
}
