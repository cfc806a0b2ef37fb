import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { migrateDatabase } from "../../server/db/client";
import { prepareCluster, type Cluster } from "../../scripts/lib/postgres";
import { freePort } from "../../scripts/lib/process";

/** A migrated database nobody connects to, copied for tests that need a database of their own. */
export const templateDatabase = "lintel_template";

/**
 * A throwaway PostgreSQL cluster for one test run: its own folder under the temp directory and a
 * free port, so it never touches `npm start`'s data and works while `npm start` runs.
 */
export async function startTestCluster(label: string): Promise<{ cluster: Cluster; url: string }> {
  const folder = mkdtempSync(path.join(os.tmpdir(), `lintel-${label}-`));
  const cluster = await prepareCluster({ folder, port: await freePort(), throwaway: true });
  await cluster.start();
  cluster.createDatabase(templateDatabase);
  await migrateDatabase(cluster.urlFor(templateDatabase));
  cluster.createDatabase("lintel_test", templateDatabase);
  return { cluster, url: cluster.urlFor("lintel_test") };
}
