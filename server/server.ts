import type { AddressInfo } from "node:net";
import { createServer } from "node:http";

import { createApp } from "./app";
import { connectDatabase, migrateDatabase } from "./db/client";
import { runDemoSteps } from "./demo/run-demo-steps";
import { demoStepList } from "./demo/steps";
import { buildDeps } from "./deps";
import type { Env } from "./env";
import { createLogger } from "./lib/logger";

export interface RunningServer {
  url: string;
  close: () => Promise<void>;
}

/** Migrates, loads demo data when asked, and listens. `close` stops accepting and drains. */
export async function startServer(env: Env): Promise<RunningServer> {
  const logger = createLogger(env.LOG_LEVEL);
  await migrateDatabase(env.DATABASE_URL);
  const database = connectDatabase(env.DATABASE_URL);
  if (env.LINTEL_DEMO === "1") await runDemoSteps(database.db, logger, demoStepList);

  const app = createApp(buildDeps(env, database, logger));
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(env.PORT, env.HOST, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const shownHost = env.HOST === "0.0.0.0" || env.HOST === "::" ? "127.0.0.1" : env.HOST;
  const url = `http://${shownHost}:${port}`;
  logger.info({ url }, "Lintel is listening");

  return {
    url,
    async close() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      });
      await database.close();
    },
  };
}
