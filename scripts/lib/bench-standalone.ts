import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { migrateDatabase } from "../../server/db/client";
import { parseEnv } from "../../server/env";
import { startServer } from "../../server/server";
import { prepareCluster, type Cluster } from "./postgres";
import { freePort } from "./process";
import { startS3Fake } from "./s3-fake";

/**
 * Runs one bench on its own (`npx tsx scripts/bench-x.ts`): a throwaway cluster and S3 fake,
 * removed afterwards, as `npm run bench` gives every bench.
 */
export async function runBenchAlone(
  name: string,
  bench: (cluster: Cluster, s3Endpoint: string) => Promise<void>,
): Promise<void> {
  const folder = mkdtempSync(path.join(os.tmpdir(), `lintel-bench-${name}-db-`));
  const s3Dir = mkdtempSync(path.join(os.tmpdir(), `lintel-bench-${name}-s3-`));
  const cluster = await prepareCluster({ folder, port: await freePort(), throwaway: true });
  await cluster.start();
  const s3 = await startS3Fake({ dir: s3Dir });
  try {
    await bench(cluster, s3.endpoint);
  } finally {
    await s3.stop();
    cluster.destroy();
    rmSync(s3Dir, { recursive: true, force: true });
  }
}

/** A database of the bench's own in the cluster, migrated; its address. */
export async function benchDatabase(cluster: Cluster, name: string): Promise<string> {
  cluster.createDatabase(name);
  const url = cluster.urlFor(name);
  await migrateDatabase(url);
  return url;
}

/**
 * The server as the benches run it, in this process: a free loopback port, warnings only, no
 * e-mail worker or action notices, no demo data, and sign-in limits far above the thousands of
 * timed calls. `env` adds to or overrides these.
 */
export async function startBenchServer(
  url: string,
  s3Endpoint: string,
  env: Record<string, string> = {},
) {
  return startServer(
    parseEnv({
      DATABASE_URL: url,
      PORT: String(await freePort()),
      LOG_LEVEL: "warn",
      LINTEL_DEMO: "0",
      LINTEL_OUTBOX_WORKER: "0",
      LINTEL_ACTION_NOTICES: "0",
      LINTEL_LOGIN_LIMIT_ACCOUNT: "100000",
      LINTEL_LOGIN_LIMIT_ADDRESS: "100000",
      S3_ENDPOINT: s3Endpoint,
      ...env,
    }),
  );
}
