import { pathToFileURL } from "node:url";

import pg from "pg";

import { hashPassword } from "../server/auth/password";
import { agent, browserGet, httpTimes, percentile } from "./lib/bench-http";
import { benchDatabase, runBenchAlone, startBenchServer } from "./lib/bench-standalone";
import type { Cluster } from "./lib/postgres";

/**
 * A room's pressure charts at scale: 500 monitored isolation rooms with one day of raw readings
 * (every 5 s), 30 days of one-minute roll-ups and a year of one-hour roll-ups, and the room
 * page's 24-hour and 30-day series timed over HTTP as a phone asks for them.
 */
const monitors = Number(process.env.BENCH_PRESSURE_MONITORS ?? 500);
const rawEverySeconds = Number(process.env.BENCH_PRESSURE_RAW_SECONDS ?? 5);
const calls = Number(process.env.BENCH_PRESSURE_CALLS ?? 200);
const password = "bench pressure passphrase";

/** Seeds with generate_series in PostgreSQL: a smooth negative differential with some noise. */
async function seed(client: pg.Client, spaceIds: string[]) {
  const value = (at: string) =>
    `-6 + 1.5 * sin(extract(epoch from ${at}) / 900 + m.n) + (random() - 0.5)`;
  await client.query(
    `insert into pressure_readings (monitor_id, measured_at, pressure, unit, pressure_pa, door)
     select m.id, t, v, 'Pa', v, null
       from (select 'bench-' || lpad(n::text, 4, '0') as id, n from generate_series(1, $1::int) n) m
       cross join generate_series(date_trunc('minute', now()) - interval '1 day', now(), make_interval(secs => $2)) t
       cross join lateral (select round((${value("t")})::numeric, 2)::float8 as v) r`,
    [spaceIds.length, rawEverySeconds],
  );
  for (const [table, step, span] of [
    ["pressure_minutes", "1 minute", "30 days"],
    ["pressure_hours", "1 hour", "365 days"],
  ] as const) {
    await client.query(
      `insert into ${table} (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa, door_open_readings${table === "pressure_hours" ? ", minutes_with_readings" : ""})
       select m.id, t, r.k, r.k * r.v, r.v - 0.5, r.v + 0.5, 0${table === "pressure_hours" ? ", 60" : ""}
         from (select 'bench-' || lpad(n::text, 4, '0') as id, n from generate_series(1, $1::int) n) m
         cross join generate_series(date_trunc('${step.split(" ")[1]}', now()) - interval '${span}', now(), interval '${step}') t
         cross join lateral (select ${step === "1 minute" ? 12 : 720} as k, ${value("t")} as v) r
       on conflict do nothing`,
      [spaceIds.length],
    );
  }
  await client.query(
    `insert into pressure_monitors (monitor_id, site_id, space_id)
     select 'bench-' || lpad(n::text, 4, '0'), s.site_id, s.id
       from unnest($1::uuid[]) with ordinality as u(space_id, n) join spaces s on s.id = u.space_id`,
    [spaceIds],
  );
  await client.query("analyze");
}

export async function benchPressureChart(cluster: Cluster, s3Endpoint: string): Promise<void> {
  const url = await benchDatabase(cluster, "lintel_bench_pressure_chart");
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const server = await startBenchServer(url, s3Endpoint);
  try {
    const t0 = performance.now();
    const { rows: network } = await client.query<{ id: string }>(
      "insert into networks (name) values ('Bench Network') returning id",
    );
    const networkId = network[0]!.id;
    const { rows: site } = await client.query<{ id: string }>(
      `insert into sites (network_id, name, address, time_zone, latitude, longitude)
       values ($1, 'Bench site', 'Bench Road 1', 'Europe/London', 50.7, -3.5) returning id`,
      [networkId],
    );
    const siteId = site[0]!.id;
    const { rows: person } = await client.query<{ id: string }>(
      `insert into users (network_id, email, display_name, password_hash)
       values ($1, 'bench.facilities@example.org', 'Bench Facilities', $2) returning id`,
      [networkId, await hashPassword(password)],
    );
    await client.query(
      "insert into role_grants (user_id, role, site_id) values ($1, 'facilities_lead', $2)",
      [person[0]!.id, siteId],
    );
    const { rows: spaces } = await client.query<{ id: string }>(
      `with floor as (insert into floors (site_id, building, level, name) values ($1, 'Main block', 1, 'Level 1') returning id)
       insert into spaces (floor_id, site_id, zone_type, name, polygon)
       select floor.id, $1, 'isolation_room', 'Room ' || j, '[[0,0],[100,0],[100,100],[0,100]]'::jsonb
         from floor cross join generate_series(1, $2::int) j
       order by j returning id`,
      [siteId, monitors],
    );
    const spaceIds = spaces.map((row) => row.id);
    await seed(client, spaceIds);
    const { rows: counts } = await client.query<{ raw: string; minutes: string; hours: string }>(
      `select (select count(*) from pressure_readings) as raw, (select count(*) from pressure_minutes) as minutes,
              (select count(*) from pressure_hours) as hours`,
    );
    const n = (value: string) => Number(value).toLocaleString("en-GB");
    console.log(
      `  seeded ${monitors} monitors: ${n(counts[0]!.raw)} raw readings (1 day every ${rawEverySeconds} s), ${n(counts[0]!.minutes)} one-minute roll-ups (30 days), ${n(counts[0]!.hours)} one-hour roll-ups (a year) in ${((performance.now() - t0) / 1000).toFixed(0)} s`,
    );

    const origin = server.url;
    const signIn = await fetch(`${origin}/api/auth/sign-in`, {
      method: "POST",
      headers: { "content-type": "application/json", origin },
      body: JSON.stringify({ email: "bench.facilities@example.org", password }),
    });
    const cookie = signIn.headers.getSetCookie()[0]!.split(";")[0]!;
    console.log(`\nA room's pressure series, ${calls} calls each over rooms in turn (ms):`);
    for (const range of ["24h", "30d"] as const) {
      const urls = spaceIds.map((id) => `${origin}/api/spaces/${id}/pressure?range=${range}`);
      await browserGet(urls[0]!, cookie, origin);
      const times: number[] = [];
      for (let call = 0; call < calls; call += 1)
        times.push(...(await httpTimes(urls[(call * 37) % urls.length]!, cookie, origin, 1)));
      console.log(
        `  ${range.padEnd(4)} p50 ${percentile(times, 50).toFixed(1).padStart(6)}   p95 ${percentile(times, 95).toFixed(1).padStart(6)}`,
      );
    }
  } finally {
    agent.destroy();
    await client.end();
    await server.close();
  }
}

// `npx tsx scripts/bench-pressure-chart.ts`: the pressure charts alone, on a throwaway cluster
// (`BENCH_PRESSURE_MONITORS=50` seeds in seconds).
if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href)
  await runBenchAlone("pressure", benchPressureChart);
