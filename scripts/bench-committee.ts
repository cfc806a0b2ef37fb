import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";

import type { SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import pg from "pg";

import { defaultChecklists } from "../shared/checklists/defaults";
import { zoneTypes } from "../shared/zones";
import { hashPassword } from "../server/auth/password";
import { connectDatabase } from "../server/db/client";
import {
  committeeQueries,
  observationQueries,
  rebuildMonthStats,
  syncItemCategories,
  type Period,
} from "../server/modules/committee/committee.repository";
import { ensureDefaultSequences } from "../server/modules/observations/sequences.service";
import { agent, browserGet, httpTimes, percentile } from "./lib/bench-http";
import { benchDatabase, runBenchAlone, startBenchServer } from "./lib/bench-standalone";
import type { Cluster } from "./lib/postgres";

/**
 * The committee's comparison and trends at network scale: 40 sites × 60 spaces × weekly audits
 * for two years (about 250,000 audits, 24 answers each: 6 million answers), timed over HTTP beside
 * the same SQL run in psql, first with a tenth of the sites and then with all of them. Observed
 * putting-on and removal: one observation a month at every donning zone, doffing area and anteroom
 * (45 a site) over the same two years, 40 staff codes a site (about 43,000 observations).
 */
const sitesInAll = Number(process.env.BENCH_COMMITTEE_SITES ?? 40);
const spacesPerSite = 60;
const weeks = 104;
const itemsPerChecklist = 24;
const calls = Number(process.env.BENCH_COMMITTEE_CALLS ?? 200);
/** The calls go in this many alternating rounds of HTTP and psql. */
const rounds = 10;
/** Untimed calls before each endpoint is timed: this many, or as many as fit in the time. */
const warmUpCalls = 2000;
const warmUpMs = 10_000;
const password = "bench committee passphrase";

/** Bench checklists of 24 items per zone type: the default items, then extra ones. */
export async function seedChecklists(client: pg.Client, networkId: string) {
  for (const zone of zoneTypes) {
    const { rows } = await client.query<{ id: string }>(
      `insert into checklist_versions (network_id, zone_type, version, status, title, published_at)
       values ($1, $2, 1, 'published', 'Bench checklist', now()) returning id`,
      [networkId, zone],
    );
    const defaults = defaultChecklists[zone].items;
    const items = Array.from({ length: itemsPerChecklist }, (_, n) => {
      const base = defaults[n];
      return base
        ? { key: base.key, text: base.text, severity: base.severity }
        : {
            key: `bench.${zone}.${n}`,
            text: `Bench item ${n + 1}`,
            severity: n % 3 ? "minor" : "major",
          };
    });
    await client.query(
      `insert into checklist_items (version_id, key, position, text, severity, response)
       select $1, key, position, text, severity::severity, 'check'
         from unnest($2::text[], $3::int[], $4::text[], $5::text[]) as i(key, position, text, severity)`,
      [
        rows[0]!.id,
        items.map((item) => item.key),
        items.map((_, n) => n),
        items.map((item) => item.text),
        items.map((item) => item.severity),
      ],
    );
  }
}

/** Sites `first`..`last` with their spaces, two years of weekly audits, answers and actions. */
export async function seedSites(
  client: pg.Client,
  networkId: string,
  auditorId: string,
  first: number,
  last: number,
) {
  const { rows } = await client.query<{ id: string }>(
    `insert into sites (network_id, name, address, time_zone, latitude, longitude)
     select $1, 'Bench site ' || lpad(i::text, 2, '0'), 'Bench Road ' || i, 'Europe/London', 50.7, -3.5
       from generate_series($2::int, $3::int) i returning id`,
    [networkId, first, last],
  );
  const ids = rows.map((row) => row.id);
  await client.query(
    `insert into floors (site_id, building, level, name)
     select id, 'Main block', 1, 'Level 1' from unnest($1::uuid[]) id`,
    [ids],
  );
  await client.query(
    `insert into spaces (floor_id, site_id, zone_type, name, polygon)
     select f.id, f.site_id, (array['isolation_room','anteroom','donning_zone','doffing_area'])[1 + j % 4]::zone_type,
            'Space ' || j, '[[0,0],[100,0],[100,100],[0,100]]'::jsonb
       from floors f cross join generate_series(1, $2::int) j
      where f.site_id = any($1::uuid[])`,
    [ids, spacesPerSite],
  );
  await client.query(
    `insert into audits (id, site_id, space_id, checklist_version_id, auditor_id, status, started_at, submitted_at, verdict)
     select gen_random_uuid(), sp.site_id, sp.id, v.id, $2, 'submitted', t.at, t.at + interval '40 minutes', 'all_clear'
       from spaces sp
       join checklist_versions v on v.network_id = $3 and v.zone_type = sp.zone_type
       cross join generate_series(0, $4::int - 1) w
       cross join lateral (select now() - w * interval '7 days' - random() * interval '6 days' as at) t
      where sp.site_id = any($1::uuid[])`,
    [ids, auditorId, networkId, weeks],
  );
  await client.query(
    `insert into audit_answers (id, audit_id, item_id, outcome)
     select gen_random_uuid(), a.id, ci.id,
            (case when random() < 0.035 then 'fail' when random() < 0.03 then 'not_applicable' else 'pass' end)::outcome
       from audits a join checklist_items ci on ci.version_id = a.checklist_version_id
      where a.site_id = any($1::uuid[])`,
    [ids],
  );
  await client.query(
    `update audits a
        set verdict = (case when x.critical then 'hold' when x.failed then 'gaps_to_fix' else 'all_clear' end)::verdict
       from (select aa.audit_id, bool_or(aa.outcome = 'fail' and ci.severity = 'critical') as critical,
                    bool_or(aa.outcome = 'fail') as failed
               from audit_answers aa
               join checklist_items ci on ci.id = aa.item_id
               join audits a2 on a2.id = aa.audit_id
              where a2.site_id = any($1::uuid[])
              group by aa.audit_id) x
      where x.audit_id = a.id and x.failed`,
    [ids],
  );
  // Four actions a space: three done over the two years, one still to fix (some overdue).
  await client.query(
    `insert into corrective_actions (site_id, space_id, floor_id, item_key, title, severity, state,
                                     opened_at, due_at, closed_at, days_to_close, x, y)
     select sp.site_id, sp.id, sp.floor_id, 'bench-' || n, 'Bench finding ' || n,
            (array['critical','major','minor'])[1 + n % 3]::severity,
            (case when n = 3 then 'to_fix' else 'done' end)::action_state,
            o.at, o.at + interval '7 days',
            case when n = 3 then null else o.at + d.days * interval '1 day' end,
            case when n = 3 then null else d.days end, 50, 50
       from spaces sp cross join generate_series(0, 3) n
       cross join lateral (select now() - random() * interval '700 days' as at) o
       cross join lateral (select round((random() * 20)::numeric, 1)::float8 as days) d
      where sp.site_id = any($1::uuid[])`,
    [ids],
  );
  // One observation a month at each donning zone, doffing area and anteroom, of a published
  // sequence of the right kind; glove and gown removal breached most; coaching after some breaches.
  await client.query(
    `insert into observations (id, site_id, space_id, sequence_version_id, observer_id, staff_code,
                               staff_role, started_at, finished_at, outcome, breach_count,
                               hand_hygiene_performed, hand_hygiene_expected, coaching_given, body_hash)
     select gen_random_uuid(), sp.site_id, sp.id, v.id, $2,
            'B' || (1000 + floor(random() * 40))::int, 'nurse', t.at - interval '8 minutes', t.at,
            'clean_run', 0, 0, 0, false, md5(random()::text)
       from spaces sp
       cross join generate_series(0, $4::int - 1) m
       cross join lateral (select now() - m * interval '30 days' - random() * interval '29 days' as at) t
       cross join lateral (
         select sv.id from sequence_versions sv
          where sv.network_id = $3 and sv.status = 'published'
            and sv.kind = (case when sp.zone_type = 'donning_zone' then 'putting_on' else 'removal' end)::sequence_kind
            and t.at is not null
          order by random() limit 1) v
      where sp.site_id = any($1::uuid[]) and sp.zone_type in ('donning_zone', 'doffing_area', 'anteroom')`,
    [ids, auditorId, networkId, Math.round(weeks / 4.33)],
  );
  await client.query(
    `insert into observation_steps (observation_id, step_id, position, done, breached)
     select o.id, ss.id, ss.position, true,
            random() < (case when ss.key ~ '(glove|gown)' and not ss.hand_hygiene then 0.15 else 0.04 end)
       from observations o join sequence_steps ss on ss.version_id = o.sequence_version_id
      where o.site_id = any($1::uuid[])`,
    [ids],
  );
  await client.query(
    `update observations o
        set breach_count = x.breached,
            outcome = (case when x.breached > 0 then 'breaches_seen' else 'clean_run' end)::observation_outcome,
            hand_hygiene_expected = x.expected, hand_hygiene_performed = x.performed,
            coaching_given = x.breached > 0 and random() < 0.8
       from (select os.observation_id, count(*) filter (where os.breached)::int as breached,
                    count(*) filter (where ss.hand_hygiene)::int as expected,
                    count(*) filter (where ss.hand_hygiene and not os.breached)::int as performed
               from observation_steps os
               join sequence_steps ss on ss.id = os.step_id
               join observations o2 on o2.id = os.observation_id
              where o2.site_id = any($1::uuid[])
              group by os.observation_id) x
      where x.observation_id = o.id`,
    [ids],
  );
  await client.query("analyze");
  return ids;
}

/** The SQL text with its parameters written in, as psql would be given it. */
export function literalSql(query: SQL) {
  const { sql, params } = new PgDialect().sqlToQuery(query);
  return sql.replace(/\$(\d+)/g, (_, n: string) => {
    const value = params[Number(n) - 1];
    return `'${String(value).replace(/'/g, "''")}'`;
  });
}

/**
 * Runs each statement `times` times in psql with \timing; returns the times by statement. Each
 * psql is a new connection, whose first statement also loads the catalogue into its new backend
 * (about 2 ms more here); the server's pooled connections did that long ago, so each statement
 * first runs once untimed.
 */
export function psqlTimes(cluster: Cluster, database: string, statements: string[], times: number) {
  const dir = mkdtempSync(path.join(os.tmpdir(), "lintel-bench-sql-"));
  const file = path.join(dir, "bench.sql");
  const warm = statements.map((statement) => `${statement};`).join("\n");
  const body = statements.map((statement) => Array(times).fill(`${statement};`).join("\n"));
  writeFileSync(file, `\\o /dev/null\n${warm}\n\\timing on\n${body.join("\n")}\n`);
  try {
    const output = execFileSync(
      path.join(cluster.binDir, "psql"),
      [
        "-X",
        "-q",
        "-h",
        "127.0.0.1",
        "-p",
        String(cluster.port),
        "-U",
        "postgres",
        "-d",
        database,
        "-f",
        file,
      ],
      { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 },
    );
    const all = [...output.matchAll(/Time: ([\d.]+) ms/g)].map((match) => Number(match[1]));
    return statements.map((_, index) => all.slice(index * times, (index + 1) * times));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

interface ScaleResult {
  sites: number;
  audits: number;
  answers: number;
  endpoints: Record<string, { p50: number; p95: number; sqlP50: number; sqlP95: number }>;
  /** Any signed-in request's own cost: session, grants, JSON, loopback (GET /api/auth/me). */
  baseline: { p50: number; p95: number };
}

export async function benchCommittee(cluster: Cluster, s3Endpoint: string): Promise<void> {
  const database = "lintel_bench_committee";
  const url = await benchDatabase(cluster, database);
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const server = await startBenchServer(url, s3Endpoint);
  try {
    const { rows: network } = await client.query<{ id: string }>(
      "insert into networks (name) values ('Bench Network') returning id",
    );
    const networkId = network[0]!.id;
    const { rows: people } = await client.query<{ id: string }>(
      `insert into users (network_id, email, display_name, password_hash)
       values ($1, 'bench.committee@example.org', 'Bench Committee', $2),
              ($1, 'bench.auditor@example.org', 'Bench Auditor', null) returning id`,
      [networkId, await hashPassword(password)],
    );
    await client.query(
      "insert into role_grants (user_id, role, site_id) values ($1, 'committee_member', null)",
      [people[0]!.id],
    );
    await seedChecklists(client, networkId);
    const sequencesHandle = connectDatabase(url, { max: 1 });
    await ensureDefaultSequences(sequencesHandle.db, networkId);
    await sequencesHandle.close();
    const origin = server.url;
    const signIn = await fetch(`${origin}/api/auth/sign-in`, {
      method: "POST",
      headers: { "content-type": "application/json", origin },
      body: JSON.stringify({ email: "bench.committee@example.org", password }),
    });
    const cookie = signIn.headers.getSetCookie()[0]!.split(";")[0]!;

    const now = new Date();
    const month = (back: number) =>
      new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 1))
        .toISOString()
        .slice(0, 7);
    const period: Period = { from: month(11), to: month(0) };
    const query = `from=${period.from}&to=${period.to}`;

    const results: ScaleResult[] = [];
    const siteIds: string[] = [];
    const tenth = Math.max(1, Math.round(sitesInAll / 10));
    for (const [first, last] of [
      [1, tenth],
      [tenth + 1, sitesInAll],
    ] as const) {
      const t0 = performance.now();
      siteIds.push(...(await seedSites(client, networkId, people[1]!.id, first, last)));
      const handle = connectDatabase(url, { max: 1 });
      await syncItemCategories(handle.db);
      await rebuildMonthStats(handle.db, siteIds);
      await handle.close();
      const { rows: counts } = await client.query<{
        audits: number;
        answers: number;
        observations: number;
        steps: number;
      }>(
        `select (select count(*) from audits)::int as audits, (select count(*) from audit_answers)::int as answers,
                (select count(*) from observations)::int as observations,
                (select count(*) from observation_steps)::int as steps`,
      );
      console.log(
        `  seeded ${siteIds.length} sites: ${counts[0]!.audits.toLocaleString("en-GB")} audits, ${counts[0]!.answers.toLocaleString("en-GB")} answers, ${counts[0]!.observations.toLocaleString("en-GB")} observations (${counts[0]!.steps.toLocaleString("en-GB")} observed steps), monthly totals rebuilt (${((performance.now() - t0) / 1000).toFixed(0)} s)`,
      );

      const endpoints = {
        comparison: {
          url: `${origin}/api/committee/comparison?${query}&siteA=${siteIds[0]}&siteB=${siteIds[1] ?? siteIds[0]}`,
          sql: [committeeQueries.comparison(networkId, null, period)],
        },
        trends: {
          url: `${origin}/api/committee/trends?${query}`,
          sql: [
            committeeQueries.readinessByMonth(siteIds, period),
            committeeQueries.agingUnfinished(siteIds),
            committeeQueries.agingOverdue(siteIds),
            committeeQueries.closeTimes(siteIds, period),
          ],
        },
        // One statement: the readable sites and every observation figure's counts.
        observations: {
          url: `${origin}/api/committee/observations?${query}`,
          sql: [observationQueries.figures(networkId, null, period)],
        },
      };
      const scale: ScaleResult = {
        sites: siteIds.length,
        audits: counts[0]!.audits,
        answers: counts[0]!.answers,
        endpoints: {},
        baseline: { p50: 0, p95: 0 },
      };
      // The kept-alive connection may have been closed by the server while seeding: one call,
      // retried once, opens a fresh one before anything is timed.
      await browserGet(`${origin}/api/auth/me`, cookie, origin).catch(() =>
        browserGet(`${origin}/api/auth/me`, cookie, origin),
      );
      const me = await httpTimes(`${origin}/api/auth/me`, cookie, origin, calls);
      scale.baseline = { p50: percentile(me, 50), p95: percentile(me, 95) };
      for (const [name, endpoint] of Object.entries(endpoints)) {
        // Warm-up, untimed: a server that has been up a while has its request path compiled and
        // optimised. That takes a couple of thousand calls here (the share of calls slower than
        // the median by over 1 ms fell from 13% in the first 200 to 4% after 3,000); with a
        // handful, the slowest calls would time the compiler rather than the request.
        const warmUntil = performance.now() + warmUpMs;
        for (let n = 0; n < warmUpCalls && performance.now() < warmUntil; n += 1)
          await browserGet(endpoint.url, cookie, origin);
        // In alternating rounds, so that whatever else the machine does at a given moment
        // weighs on both sides alike rather than on whichever ran then.
        const http: number[] = [];
        const statements: number[][] = endpoint.sql.map(() => []);
        const literal = endpoint.sql.map(literalSql);
        for (let round = 0; round < rounds; round += 1) {
          const share = Math.ceil(calls / rounds);
          // psql blocks this process, the server's too: a connection left idle past the server's
          // keep-alive timeout would be closed just as the next call goes out. Untimed, reopen it.
          agent.destroy();
          await browserGet(endpoint.url, cookie, origin);
          http.push(...(await httpTimes(endpoint.url, cookie, origin, share)));
          psqlTimes(cluster, database, literal, share).forEach((times, index) =>
            statements[index]!.push(...times),
          );
        }
        // The comparison runs one statement; the trends run theirs after the readable sites, some
        // at once: the bare figure is the sum of each statement's own percentile.
        const sum = (p: number) =>
          statements.reduce((total, times) => total + percentile(times, p), 0);
        scale.endpoints[name] = {
          p50: percentile(http, 50),
          p95: percentile(http, 95),
          sqlP50: sum(50),
          sqlP95: sum(95),
        };
      }
      results.push(scale);
      // Idle through the next scale's minutes of seeding, the connection would be dropped under
      // the agent: close it now, and the next scale opens a fresh one.
      agent.destroy();
    }

    console.log(
      `\nCommittee queries, ${calls} calls each, period ${period.from} to ${period.to} (ms):`,
    );
    console.log(
      [
        "endpoint".padEnd(12),
        "sites".padStart(6),
        "audits".padStart(9),
        "answers".padStart(10),
        "p50".padStart(7),
        "p95".padStart(7),
        "psql p50".padStart(9),
        "psql p95".padStart(9),
        "p95/psql".padStart(9),
        "(p50−me)/psql".padStart(14),
      ].join(" "),
    );
    for (const scale of results) {
      for (const [name, e] of Object.entries(scale.endpoints)) {
        console.log(
          [
            name.padEnd(12),
            String(scale.sites).padStart(6),
            scale.audits.toLocaleString("en-GB").padStart(9),
            scale.answers.toLocaleString("en-GB").padStart(10),
            e.p50.toFixed(1).padStart(7),
            e.p95.toFixed(1).padStart(7),
            e.sqlP50.toFixed(1).padStart(9),
            e.sqlP95.toFixed(1).padStart(9),
            `${(e.p95 / e.sqlP95).toFixed(2)}×`.padStart(9),
            `${(Math.max(0, e.p50 - scale.baseline.p50) / e.sqlP50).toFixed(2)}×`.padStart(14),
          ].join(" "),
        );
      }
    }
    const exportStarted = performance.now();
    const exported = await fetch(`${origin}/api/committee/audits/export?${query}`, {
      headers: { cookie, origin },
    });
    const csv = await exported.text();
    console.log(
      `  audits CSV for the period: ${(csv.split("\n").length - 2).toLocaleString("en-GB")} rows, ${(csv.length / 1024 / 1024).toFixed(1)} MB in ${((performance.now() - exportStarted) / 1000).toFixed(1)} s`,
    );
    const reportStarted = performance.now();
    const report = await fetch(`${origin}/api/committee/report?${query}`, {
      headers: { cookie, origin },
    });
    const pdf = await report.arrayBuffer();
    console.log(
      `  monthly report PDF: ${(pdf.byteLength / 1024).toFixed(0)} kB in ${((performance.now() - reportStarted) / 1000).toFixed(1)} s`,
    );
    const [small, large] = results as [ScaleResult, ScaleResult];
    for (const name of Object.keys(large.endpoints)) {
      const growth = large.endpoints[name]!.p95 / small.endpoints[name]!.p95;
      // The comparison and trends read monthly totals, so they should grow far slower than the
      // data; the observations are counted one by one in the period, so theirs grows with it.
      const target = name === "observations" ? "grows with the observations" : "target ≤ 3×";
      console.log(
        `  ${name}: ${(large.audits / small.audits).toFixed(1)}× the data → ${growth.toFixed(2)}× the p95 (${target}); p95 ${large.endpoints[name]!.p95.toFixed(1)} ms (target ≤ 300 ms)`,
      );
    }
    console.log(
      `  Targets: p95 ≤ 300 ms, within 1.5× of the bare SQL. The HTTP figure includes the session check, JSON and the loopback round trip (GET /api/auth/me alone: p50 ${small.baseline.p50.toFixed(1)} / ${large.baseline.p50.toFixed(1)} ms), which the last column takes off; the psql figure includes parsing and planning.`,
    );
  } finally {
    agent.destroy();
    await client.end();
    await server.close();
  }
}

// `npx tsx scripts/bench-committee.ts`: the committee figures alone, on a throwaway cluster
// (`BENCH_COMMITTEE_SITES=4` seeds in seconds rather than minutes).
if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href)
  await runBenchAlone("committee", benchCommittee);
