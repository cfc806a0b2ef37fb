import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { ensureChromium } from "../../scripts/lib/chromium";
import { startDemoIdentityProvider } from "../../scripts/lib/identity-provider";
import { startMailCatcher } from "../../scripts/lib/mail-catcher";
import { startS3Fake } from "../../scripts/lib/s3-fake";
import { buildClient } from "../../scripts/lib/client-build";
import { freePort } from "../../scripts/lib/process";
import { parseEnv } from "../../server/env";
import { startServer } from "../../server/server";
import { startTestCluster } from "./test-cluster";

/**
 * For the browser project: chromium, a throwaway database with the demo network, the client built
 * into a temp folder (never the `npm start` build), and the real server on a free port.
 */
export default async function setup() {
  const [chromium, { cluster, url }] = await Promise.all([
    ensureChromium(),
    startTestCluster("browser"),
  ]);
  const clientDir = mkdtempSync(path.join(os.tmpdir(), "lintel-client-"));
  const mailboxDir = mkdtempSync(path.join(os.tmpdir(), "lintel-mailbox-"));
  const catcher = await startMailCatcher({ dir: mailboxDir });
  const s3Dir = mkdtempSync(path.join(os.tmpdir(), "lintel-s3-"));
  const s3 = await startS3Fake({ dir: s3Dir });
  await buildClient(clientDir);
  const port = await freePort();
  const server = await startServer(
    parseEnv({
      NODE_ENV: "test",
      DATABASE_URL: url,
      HOST: "127.0.0.1",
      PORT: String(port),
      LOG_LEVEL: "warn",
      LINTEL_DEMO: "1",
      LINTEL_CLIENT_DIR: clientDir,
      SMTP_PORT: String(catcher.port),
      LINTEL_OUTBOX_POLL_MS: "100",
      LINTEL_ACTION_NOTICE_MS: "300",
      // No monitors publish here (no broker, no simulator): the tests seed readings and alarms
      // themselves, and a round would call the demo's silent monitors "no readings".
      LINTEL_PRESSURE_ALARMS: "0",
      S3_ENDPOINT: s3.endpoint,
    }),
    {
      mailCatcherDir: mailboxDir,
      demoIdentityProvider: (publicUrl) => startDemoIdentityProvider({ publicUrl }),
    },
  );
  process.env.LINTEL_E2E_URL = server.url;
  process.env.LINTEL_E2E_CHROMIUM = chromium;
  process.env.LINTEL_E2E_MAILBOX_DIR = mailboxDir;
  // The service worker's update test publishes a changed worker there, as a new release would.
  process.env.LINTEL_E2E_CLIENT_DIR = clientDir;
  // Not DATABASE_URL: the API project sets that one for its own cluster in this same process.
  process.env.LINTEL_E2E_DATABASE_URL = url;

  return async () => {
    await server.close();
    await catcher.stop();
    await s3.stop();
    rmSync(s3Dir, { recursive: true, force: true });
    cluster.destroy();
    rmSync(clientDir, { recursive: true, force: true });
    rmSync(mailboxDir, { recursive: true, force: true });
  };
}
