import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { startS3Fake } from "../../scripts/lib/s3-fake";
import { startTestCluster } from "./test-cluster";

// Runs once for the API project: workers inherit DATABASE_URL and S3_ENDPOINT from this process.
export default async function setup() {
  const s3Dir = mkdtempSync(path.join(os.tmpdir(), "lintel-s3-"));
  const [{ cluster, url }, s3] = await Promise.all([
    startTestCluster("api"),
    startS3Fake({ dir: s3Dir }),
  ]);
  process.env.DATABASE_URL = url;
  process.env.S3_ENDPOINT = s3.endpoint;
  process.env.LINTEL_TEST_S3_DIR = s3Dir;
  const { createStorage } = await import("../../server/lib/storage");
  const { testEnv } = await import("../helpers/test-env");
  const storage = createStorage(testEnv());
  await storage.ensureBucket();
  storage.close();
  return async () => {
    await s3.stop();
    cluster.destroy();
    rmSync(s3Dir, { recursive: true, force: true });
  };
}
