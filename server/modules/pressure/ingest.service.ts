import { readFileSync } from "node:fs";

import mqtt, { type IClientOptions, type MqttClient } from "mqtt";
import pg from "pg";
import type { Logger } from "pino";

import {
  defaultPressureTopicPrefix,
  parsePressureMessage,
  pressureTopicFilter,
  type PressureReading,
} from "@shared/schemas/pressure-readings";

import type { Database } from "../../db/client";
import type { Env } from "../../env";
import type { OnStored } from "./ingest.hook";
import { storeReadings, tally } from "./readings.repository";

/**
 * The one key every Lintel process tries for the ingest lock (a PostgreSQL session advisory lock):
 * only the process holding it subscribes to the broker, so readings are stored by one process
 * however many run.
 */
export const ingestLockKey = 7_305_318_042_018n;

export interface MqttSettings {
  url: string;
  username?: string;
  password?: string;
  /** PEM text of the certificate authority that signed the broker's certificate. */
  ca?: string;
  rejectUnauthorized: boolean;
  clientId: string;
  topicPrefix: string;
}

export interface PressureIngestOptions {
  db: Database;
  /** Where the lock's own connection goes (the same database as `db`). */
  databaseUrl: string;
  logger: Logger;
  mqtt: MqttSettings;
  /** Called with what each batch inserted (never with duplicates): the alarm job's hook. */
  onStored?: OnStored;
  now?: () => Date;
  /** A batch is stored after this long or at `batchMax` readings, whichever comes first. */
  batchMs?: number;
  batchMax?: number;
  /** The advisory lock's key; every process of one installation uses the same (the default). */
  lockKey?: bigint;
  /** How often a process without the lock tries it again (and the holder checks it still has it). */
  lockRetryMs?: number;
}

/** What this process's ingestion has done since it started. */
export interface IngestCounts {
  received: number;
  stored: number;
  duplicates: number;
  future: number;
  invalid: number;
}

export type IngestState = "stopped" | "standby" | "ingesting";

export type PressureIngest = ReturnType<typeof createPressureIngest>;

/** The broker address without any user name or password in it, for the logs. */
export function safeBrokerAddress(url: string): string {
  try {
    const parsed = new URL(url);
    parsed.username = "";
    parsed.password = "";
    return parsed.toString();
  } catch {
    return "(unreadable broker address)";
  }
}

/** The settings from the environment, or null when no broker is configured. */
export function mqttSettingsFrom(env: Env): MqttSettings | null {
  if (!env.LINTEL_MQTT_URL) return null;
  return {
    url: env.LINTEL_MQTT_URL,
    username: env.LINTEL_MQTT_USERNAME,
    password: env.LINTEL_MQTT_PASSWORD,
    ca: env.LINTEL_MQTT_CA_FILE ? readFileSync(env.LINTEL_MQTT_CA_FILE, "utf8") : undefined,
    rejectUnauthorized: env.LINTEL_MQTT_REJECT_UNAUTHORIZED === "true",
    clientId: env.LINTEL_MQTT_CLIENT_ID,
    topicPrefix: env.LINTEL_MQTT_TOPIC_PREFIX,
  };
}

/**
 * Listens to every monitor's topic and stores the readings, a short batch at a time. Messages come
 * at least once (QoS 1, a kept session, so a broker holds them while no Lintel process listens);
 * storing is idempotent on monitor and time, so a redelivery or an out-of-order message is stored
 * once, in time order. A message that is not a reading is counted and logged (topic and fields at
 * fault, never the payload) and never stops ingestion.
 */
export function createPressureIngest(options: PressureIngestOptions) {
  const { logger } = options;
  const now = options.now ?? (() => new Date());
  const batchMs = options.batchMs ?? 200;
  const batchMax = options.batchMax ?? 500;
  const lockRetryMs = options.lockRetryMs ?? 5_000;
  const prefix = options.mqtt.topicPrefix || defaultPressureTopicPrefix;
  const broker = safeBrokerAddress(options.mqtt.url);
  const counts: IngestCounts = { received: 0, stored: 0, duplicates: 0, future: 0, invalid: 0 };

  let state = "stopped" as IngestState;
  let lockClient: pg.Client | null = null;
  let client: MqttClient | null = null;
  let lockTimer: NodeJS.Timeout | null = null;
  let batchTimer: NodeJS.Timeout | null = null;
  let pending: PressureReading[] = [];
  let invalidPending = 0;
  let flushing: Promise<void> = Promise.resolve();
  let attempt: Promise<void> | null = null;
  const listeners = new Set<(state: IngestState) => void>();

  const setState = (next: IngestState) => {
    if (state === next) return;
    state = next;
    for (const listener of listeners) listener(next);
  };

  function scheduleFlush() {
    if (pending.length >= batchMax) {
      void flush();
      return;
    }
    batchTimer ??= setTimeout(() => void flush(), batchMs);
  }

  /** Stores what is waiting; batches run one after another, never two at once. */
  function flush(): Promise<void> {
    if (batchTimer) clearTimeout(batchTimer);
    batchTimer = null;
    flushing = flushing.then(async () => {
      const batch = pending;
      const invalid = invalidPending;
      pending = [];
      invalidPending = 0;
      if (batch.length === 0 && invalid === 0) return;
      const at = now();
      try {
        if (invalid > 0) await tally(options.db, { source: "mqtt", now: at }, { invalid });
        if (batch.length === 0) return;
        const outcome = await storeReadings(options.db, batch, { source: "mqtt", now: at });
        counts.stored += outcome.stored;
        counts.duplicates += outcome.duplicates;
        counts.future += outcome.future.length;
        if (outcome.future.length > 0)
          logger.warn(
            {
              future: outcome.future.length,
              monitors: [...new Set(outcome.future.map((r) => r.monitorId))].slice(0, 10),
            },
            "pressure readings dated in the future refused (check the monitors' clocks)",
          );
        if (outcome.inserted.length > 0 && options.onStored) {
          try {
            await options.onStored(outcome.inserted, at);
          } catch (err) {
            logger.error({ err }, "after storing pressure readings, the alarm hook failed");
          }
        }
      } catch (err) {
        // The database is away: keep the readings (they were acknowledged) and try again soon.
        logger.warn(
          { err: { message: (err as Error).message }, waiting: batch.length },
          "pressure readings could not be stored yet; retrying",
        );
        pending = [...batch, ...pending];
        invalidPending += invalid;
        if (state !== "stopped") batchTimer ??= setTimeout(() => void flush(), 1_000);
      }
    });
    return flushing;
  }

  function onMessage(topic: string, payload: Buffer) {
    counts.received += 1;
    const parsed = parsePressureMessage(topic, payload, prefix);
    if (parsed.ok) {
      pending.push(parsed.reading);
    } else {
      counts.invalid += 1;
      invalidPending += 1;
      // The topic and what is wrong, by field; the payload itself may carry a gateway's secrets.
      logger.warn({ topic, problems: parsed.problems }, "pressure message refused");
    }
    scheduleFlush();
  }

  function connectBroker(): MqttClient {
    const settings: IClientOptions = {
      clientId: options.mqtt.clientId,
      // A kept session: the broker holds QoS 1 messages while this client is away.
      clean: false,
      reconnectPeriod: 2_000,
      connectTimeout: 10_000,
      username: options.mqtt.username,
      password: options.mqtt.password,
      ca: options.mqtt.ca,
      rejectUnauthorized: options.mqtt.rejectUnauthorized,
    };
    const next = mqtt.connect(options.mqtt.url, settings);
    next.on("connect", () => {
      logger.info({ broker }, "pressure ingest connected to the broker");
      next.subscribe(pressureTopicFilter(prefix), { qos: 1 }, (err) => {
        if (err)
          logger.error(
            { err: { message: err.message }, broker },
            "pressure topic subscribe failed",
          );
      });
    });
    next.on("message", onMessage);
    next.on("error", (err) =>
      logger.warn({ err: { message: err.message }, broker }, "pressure broker connection problem"),
    );
    return next;
  }

  async function releaseLock() {
    const held = lockClient;
    lockClient = null;
    if (held) await held.end().catch(() => undefined);
  }

  async function stopListening() {
    const listening = client;
    client = null;
    if (listening) await listening.endAsync().catch(() => undefined);
    await flush();
  }

  /** The lock's connection failed: another process may take over; stop listening at once. */
  function lockLost(reason: string) {
    if (state !== "ingesting") return;
    logger.warn({ reason }, "pressure ingest lost its lock; standing by");
    setState("standby");
    void stopListening().then(releaseLock);
  }

  async function tryLock(): Promise<void> {
    if (state === "stopped") return;
    if (state === "ingesting") {
      try {
        await lockClient!.query("select 1");
      } catch (err) {
        lockLost((err as Error).message);
      }
      return;
    }
    // Keep-alive notices a database host that vanished; the timeout keeps a check from hanging.
    const candidate = new pg.Client({
      connectionString: options.databaseUrl,
      keepAlive: true,
      query_timeout: 10_000,
    });
    candidate.on("error", (err) => {
      if (lockClient === candidate) lockLost(err.message);
    });
    try {
      await candidate.connect();
      const result = await candidate.query<{ taken: boolean }>(
        "select pg_try_advisory_lock($1::bigint) as taken",
        [(options.lockKey ?? ingestLockKey).toString()],
      );
      if (!result.rows[0]?.taken || (state as IngestState) === "stopped") {
        await candidate.end();
        return;
      }
    } catch (err) {
      await candidate.end().catch(() => undefined);
      logger.warn({ err: { message: (err as Error).message } }, "pressure ingest lock not reached");
      return;
    }
    lockClient = candidate;
    setState("ingesting");
    logger.info({ broker }, "pressure ingest took the lock; this process stores readings");
    client = connectBroker();
  }

  const round = () => {
    attempt ??= tryLock().finally(() => {
      attempt = null;
    });
    return attempt;
  };

  return {
    /** Tries the lock now and then every `lockRetryMs`; resolves after the first try. */
    async start(): Promise<void> {
      if (state !== "stopped") return;
      setState("standby");
      lockTimer = setInterval(() => void round(), lockRetryMs);
      lockTimer.unref();
      await round();
    },
    /** Stops listening, stores what is waiting and releases the lock. */
    async stop(): Promise<void> {
      if (lockTimer) clearInterval(lockTimer);
      lockTimer = null;
      await attempt;
      setState("stopped");
      await stopListening();
      await releaseLock();
    },
    state: () => state,
    counts: (): IngestCounts => ({ ...counts }),
    /** Stores whatever is waiting now (tests and the bench). */
    flush,
    /** Calls back on every change of state (tests wait on it). */
    onStateChange(listener: (state: IngestState) => void): () => void {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}
