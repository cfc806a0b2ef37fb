import type { AddressInfo } from "node:net";

import { createApp } from "./app";
import { createAppServer } from "./lib/app-server";
import { connectDatabase, migrateDatabase } from "./db/client";
import { followDemoIssuer, realIssuerConfigured } from "./demo/identity-provider";
import { runDemoSteps, type DemoIdentityProvider } from "./demo/run-demo-steps";
import { demoStepList } from "./demo/steps";
import { buildDeps } from "./deps";
import type { Env } from "./env";
import { createLogger } from "./lib/logger";
import { createMailer } from "./lib/mailer";
import { reconcileStorage } from "./lib/images";
import { createStorage } from "./lib/storage";
import { prepareMonthStats } from "./modules/committee/committee.service";
import { createActionScheduler } from "./modules/actions/actions.scheduler";
import { createPressureAlarmTimer } from "./modules/pressure/alarms.job";
import { purgeObservationDetail } from "./modules/observations/observations.service";
import { createOutboxWorker } from "./outbox/outbox-worker";
import { alarmRoundsSettled, createOnStored } from "./modules/pressure/ingest.hook";
import { createPressureIngest, mqttSettingsFrom } from "./modules/pressure/ingest.service";
import { createPartitionJob } from "./modules/pressure/partitions.job";

export interface RunningServer {
  url: string;
  /** The local demo identity provider's issuer, when one runs. */
  demoIssuer: string | null;
  close: () => Promise<void>;
}

export interface StartOptions {
  /** Given only by a process that runs the local mail catcher: its inbox becomes the demo mailbox. */
  mailCatcherDir?: string;
  /**
   * Starts the local demo identity provider (`npm start`, the browser tests). Called only with
   * demo data, outside production, and when no network points at a real issuer.
   */
  demoIdentityProvider?: (
    publicUrl: URL,
  ) => Promise<DemoIdentityProvider & { stop: () => Promise<void> }>;
}

/** Migrates, loads demo data when asked, and listens. `close` stops accepting and drains. */
export async function startServer(env: Env, options: StartOptions = {}): Promise<RunningServer> {
  const logger = createLogger(env.LOG_LEVEL);
  await migrateDatabase(env.DATABASE_URL);
  const database = connectDatabase(env.DATABASE_URL, { logger });
  const storage = createStorage(env);
  await storage.ensureBucket();
  // Objects whose upload never completed are removed now and every ten minutes.
  const reconcile = () =>
    reconcileStorage({ db: database.db, storage }).catch((err: unknown) =>
      logger.warn({ err }, "storage reconcile failed"),
    );
  // Observation detail past the network's retention period goes on the same round.
  const purge = () =>
    purgeObservationDetail(database.db).catch((err: unknown) =>
      logger.warn({ err }, "observation retention purge failed"),
    );
  await reconcile();
  await purge();
  const reconcileTimer = setInterval(() => void reconcile().then(purge), 10 * 60 * 1000);
  reconcileTimer.unref();
  let localProvider: (DemoIdentityProvider & { stop: () => Promise<void> }) | null = null;
  if (
    options.demoIdentityProvider &&
    env.LINTEL_DEMO === "1" &&
    env.NODE_ENV !== "production" &&
    !(await realIssuerConfigured(database.db))
  ) {
    try {
      localProvider = await options.demoIdentityProvider(env.publicUrl);
      await followDemoIssuer(database.db, localProvider);
      logger.info({ issuer: localProvider.issuer }, "demo identity provider is listening");
    } catch (err) {
      logger.warn({ err }, "the demo identity provider could not start; password sign-in only");
    }
  }
  if (env.LINTEL_DEMO === "1")
    await runDemoSteps(database.db, logger, demoStepList, {
      storage,
      env,
      identityProvider: localProvider,
    });
  await prepareMonthStats(database.db);

  const mailer = createMailer(env);
  const worker =
    env.LINTEL_OUTBOX_WORKER === "1"
      ? createOutboxWorker({
          db: database.db,
          mailer,
          logger,
          pollMs: env.LINTEL_OUTBOX_POLL_MS,
          retryMs: env.LINTEL_OUTBOX_RETRY_MS,
          maxAttempts: env.LINTEL_OUTBOX_MAX_ATTEMPTS,
          leaseMs: env.LINTEL_OUTBOX_LEASE_MS,
          messageIdDomain: env.publicUrl.hostname,
        })
      : null;
  worker?.start();
  const scheduler =
    env.LINTEL_ACTION_NOTICES === "1"
      ? createActionScheduler({
          db: database.db,
          env,
          logger,
          intervalMs: env.LINTEL_ACTION_NOTICE_MS,
          notifyOutbox: () => worker?.nudge(),
        })
      : null;
  scheduler?.start();
  // Room-pressure alarms: every 30 s for silences and ends; the ingest also runs them on new readings.
  const pressureAlarms =
    env.LINTEL_PRESSURE_ALARMS === "1"
      ? createPressureAlarmTimer({
          db: database.db,
          env,
          logger,
          intervalMs: 30_000,
          notifyOutbox: () => worker?.nudge(),
        })
      : null;
  pressureAlarms?.start();

  // Live room pressure: partitions made ahead (and old raw months dropped) at start and daily;
  // readings from the broker, stored by whichever process holds the ingest lock.
  const partitions = createPartitionJob({
    db: database.db,
    logger,
    rawDays: env.LINTEL_PRESSURE_RAW_DAYS,
  });
  await partitions.start();
  const mqttSettings = mqttSettingsFrom(env);
  const ingest =
    mqttSettings && env.LINTEL_PRESSURE_INGEST === "1"
      ? createPressureIngest({
          db: database.db,
          databaseUrl: env.DATABASE_URL,
          logger,
          mqtt: mqttSettings,
          onStored: createOnStored({
            db: database.db,
            env,
            logger,
            notifyOutbox: () => worker?.nudge(),
          }),
        })
      : null;
  await ingest?.start();

  const app = createApp(
    buildDeps(env, database, logger, storage, () => worker?.nudge(), {
      mailCatcherDir: options.mailCatcherDir ?? null,
    }),
  );
  const server = createAppServer(app);
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
    demoIssuer: localProvider?.issuer ?? null,
    async close() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      });
      clearInterval(reconcileTimer);
      await ingest?.stop();
      await alarmRoundsSettled(database.db);
      await partitions.stop();
      await scheduler?.stop();
      await pressureAlarms?.stop();
      await worker?.stop();
      mailer.close();
      storage.close();
      await localProvider?.stop();
      await database.close();
    },
  };
}
