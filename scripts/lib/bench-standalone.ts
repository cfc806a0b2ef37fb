import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

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
