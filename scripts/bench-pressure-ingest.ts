import { pathToFileURL } from "node:url";

import mqtt, { type MqttClient } from "mqtt";
import type pg from "pg";
import { pino } from "pino";

import { pressureTopic } from "../shared/schemas/pressure-readings";
import { connectDatabase } from "../server/db/client";
import { createPressureIngest } from "../server/modules/pressure/ingest.service";
import { benchDatabase, runBenchAlone } from "./lib/bench-standalone";
import { startMqttBroker } from "./lib/mqtt-broker";
import type { Cluster } from "./lib/postgres";

/**
 * Live room pressure, end to end through a real broker on loopback: 500 monitors publishing a
 * reading every 5 s (QoS 1, ten gateway connections) for a minute, stored by the same ingest code
 * the server runs; then a burst as fast as the gateways can publish, to see what ingestion
 * sustains. Lag is publish time (the reading's own time) to the row's insert time.
 */
export async function benchPressureIngest(cluster: Cluster): Promise<void> {
  const monitors = Number(process.env.BENCH_PRESSURE_MONITORS ?? 500);
  const seconds = Number(process.env.BENCH_PRESSURE_SECONDS ?? 60);
  const burst = Number(process.env.BENCH_PRESSURE_BURST ?? 50_000);
  const periodMs = 5_000;
  const gateways = 10;

  const url = await benchDatabase(cluster, "lintel_bench_pressure");
  const database = connectDatabase(url);
  const broker = await startMqttBroker();
  const ingest = createPressureIngest({
    db: database.db,
    databaseUrl: url,
    logger: pino({ level: "warn" }),
    mqtt: {
      url: broker.url,
      rejectUnauthorized: true,
      clientId: "lintel-bench-ingest",
      topicPrefix: "lintel/pressure",
    },
  });
  const clients: MqttClient[] = [];
  try {
    await ingest.start();
    for (let g = 0; g < gateways; g += 1)
      clients.push(await mqtt.connectAsync(broker.url, { clientId: `bench-gateway-${g}` }));
    // Let the subscription settle before the clock starts.
    await new Promise((resolve) => setTimeout(resolve, 500));
    const ids = Array.from({ length: monitors }, (_, i) => `bench-${String(i).padStart(4, "0")}`);
    const publish = (index: number, at: number, prefix = "") =>
      clients[index % gateways]!.publishAsync(
        pressureTopic(`${prefix}${ids[index]!}`),
        JSON.stringify({
          measuredAt: new Date(at).toISOString(),
          pressure: -8 + Math.random(),
          unit: "Pa",
          door: "closed",
        }),
        { qos: 1 },
      );

    // Steady: each monitor on its own offset within the 5-second period.
    const started = Date.now();
    const timers: NodeJS.Timeout[] = [];
    let published = 0;
    for (let i = 0; i < monitors; i += 1) {
      const offset = Math.floor((i / monitors) * periodMs);
      timers.push(
        setTimeout(() => {
          const send = () => {
            if (Date.now() - started >= seconds * 1000) return;
            published += 1;
            void publish(i, Date.now());
          };
          send();
          timers.push(setInterval(send, periodMs));
        }, offset),
      );
    }
    await new Promise((resolve) => setTimeout(resolve, seconds * 1000));
    for (const timer of timers) clearTimeout(timer);
    const steadyEnd = Date.now();
    await waitForRows(database.pool, "bench-", published, 30_000);
    const steady = await database.pool.query<{
      n: string;
      p50: number;
      p95: number;
      p99: number;
      max: number;
    }>(`select count(*) n,
        percentile_cont(0.5) within group (order by lag) p50,
        percentile_cont(0.95) within group (order by lag) p95,
        percentile_cont(0.99) within group (order by lag) p99,
        max(lag) max
      from (select (extract(epoch from received_at - measured_at) * 1000)::float8 lag
            from pressure_readings where monitor_id like 'bench-%') t`);
    const s = steady.rows[0]!;
    console.log(
      `  steady: ${monitors} monitors every ${periodMs / 1000} s for ${seconds} s — published ${published}, stored ${s.n} (${(Number(s.n) / ((steadyEnd - started) / 1000)).toFixed(0)} readings/s)`,
    );
    console.log(
      `  publish-to-stored lag: p50 ${s.p50.toFixed(0)} ms · p95 ${s.p95.toFixed(0)} ms · p99 ${s.p99.toFixed(0)} ms · max ${s.max.toFixed(0)} ms (each message stored, then acknowledged)`,
    );

    // Burst: as fast as the gateways publish, each message a new reading.
    const burstStart = Date.now();
    const base = burstStart - burst * 10;
    const sends: Promise<unknown>[] = [];
    for (let k = 0; k < burst; k += 1) {
      const monitor = k % monitors;
      sends.push(publish(monitor, base + Math.floor(k / monitors) * 1000, "burst-"));
      if (sends.length >= 2_000) await Promise.all(sends.splice(0));
    }
    await Promise.all(sends);
    const publishedAt = Date.now();
    await waitForRows(database.pool, "burst-bench-", burst, 120_000);
    const drained = Date.now();
    console.log(
      `  burst: ${burst} readings published in ${((publishedAt - burstStart) / 1000).toFixed(1)} s, all stored after ${((drained - burstStart) / 1000).toFixed(1)} s — ${(burst / ((drained - burstStart) / 1000)).toFixed(0)} readings/s end to end`,
    );
    const counts = ingest.counts();
    console.log(
      `  ingest counts: received ${counts.received}, stored ${counts.stored}, duplicates ${counts.duplicates}, invalid ${counts.invalid}, future ${counts.future}`,
    );
  } finally {
    await Promise.all(clients.map((client) => client.endAsync()));
    await ingest.stop();
    await broker.stop();
    await database.close();
  }
}

async function waitForRows(
  pool: pg.Pool,
  prefix: string,
  expected: number,
  timeoutMs: number,
): Promise<void> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const { rows } = await pool.query<{ n: string }>(
      "select count(*) n from pressure_readings where monitor_id like $1",
      [`${prefix}%`],
    );
    if (Number(rows[0]!.n) >= expected || Date.now() > end) return;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href)
  await runBenchAlone("pressure-ingest", benchPressureIngest);
