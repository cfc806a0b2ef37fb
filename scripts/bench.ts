import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { demoPassword } from "../server/demo/people";
import { migrateDatabase } from "../server/db/client";
import { parseEnv } from "../server/env";
import { startServer } from "../server/server";
import { prepareCluster } from "./lib/postgres";
import { freePort } from "./lib/process";

/**
 * `npm run bench`: API latency and throughput against a throwaway PostgreSQL with the demo network.
 * Prints numbers; asserts nothing. Compare runs on the same machine only.
 */
const requests = Number(process.env.BENCH_REQUESTS ?? 400);
const concurrency = Number(process.env.BENCH_CONCURRENCY ?? 8);

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

async function measure(
  label: string,
  count: number,
  parallel: number,
  call: () => Promise<Response>,
) {
  const times: number[] = [];
  let next = 0;
  const started = performance.now();
  await Promise.all(
    Array.from({ length: parallel }, async () => {
      while (next < count) {
        next += 1;
        const t0 = performance.now();
        const response = await call();
        await response.arrayBuffer();
        if (!response.ok) throw new Error(`${label}: HTTP ${response.status}`);
        times.push(performance.now() - t0);
      }
    }),
  );
  const seconds = (performance.now() - started) / 1000;
  times.sort((a, b) => a - b);
  const row = [label.padEnd(34), String(count).padStart(6), String(parallel).padStart(4)];
  const stats = [percentile(times, 50), percentile(times, 95), percentile(times, 99)].map((ms) =>
    ms.toFixed(1).padStart(8),
  );
  console.log([...row, ...stats, (count / seconds).toFixed(0).padStart(8)].join(" "));
}

async function main() {
  const folder = mkdtempSync(path.join(os.tmpdir(), "lintel-bench-"));
  const cluster = await prepareCluster({ folder, port: await freePort(), throwaway: true });
  await cluster.start();
  cluster.createDatabase("lintel_bench");
  const url = cluster.urlFor("lintel_bench");
  await migrateDatabase(url);
  const server = await startServer(
    parseEnv({
      DATABASE_URL: url,
      PORT: String(await freePort()),
      LOG_LEVEL: "warn",
      LINTEL_DEMO: "1",
      LINTEL_OUTBOX_WORKER: "0",
      LINTEL_LOGIN_LIMIT_ACCOUNT: "100000",
      LINTEL_LOGIN_LIMIT_ADDRESS: "100000",
    }),
  );
  try {
    const origin = server.url;
    const signIn = () =>
      fetch(`${origin}/api/auth/sign-in`, {
        method: "POST",
        headers: { "content-type": "application/json", origin },
        body: JSON.stringify({ email: "admin@example.org", password: demoPassword }),
      });
    const cookie = (await signIn()).headers.getSetCookie()[0]!.split(";")[0]!;
    const get = (route: string) => () => fetch(`${origin}${route}`, { headers: { cookie } });

    console.log(
      `Lintel API benchmark — ${os.cpus().length} CPUs, Node ${process.version}; times in ms`,
    );
    console.log(
      [
        "route".padEnd(34),
        "n".padStart(6),
        "conc".padStart(4),
        "p50".padStart(8),
        "p95".padStart(8),
        "p99".padStart(8),
        "req/s".padStart(8),
      ].join(" "),
    );
    await measure("GET /api/health", requests, concurrency, get("/api/health"));
    await measure(
      "GET /api/auth/me (session + grants)",
      requests,
      concurrency,
      get("/api/auth/me"),
    );
    await measure("GET /api/sites", requests, concurrency, get("/api/sites"));
    await measure("GET /api/people", requests, concurrency, get("/api/people"));
    await measure("POST /api/auth/sign-in (argon2id)", 40, 2, signIn);
  } finally {
    await server.close();
    cluster.destroy();
  }
}

void main();
