import { readFileSync } from "node:fs";

import mqtt, { type IClientOptions, type IPublishPacket, type MqttClient } from "mqtt";
import pg from "pg";
import type { Logger } from "pino";

import {
  defaultPressureTopicPrefix,
  parsePressureMessage,
  pressureTopicFilter,
  type PressureReading,
} from "@shared/schemas/pressure-readings";

import type { Database } from "../../db/client";
import { databaseCodeOf } from "../../lib/database-errors";
import type { Env } from "../../env";
import type { OnStored } from "./ingest.hook";
import { listeningClock } from "./listening";
import { storeReadings, tally, type StoreOutcome } from "./readings.repository";

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
  /** How long to wait before trying again when the database refuses a reading. */
  retryMs?: number;
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

/** Whether PostgreSQL refused a statement for its data (classes 22 and 23), not for being away. */
function refusedAsData(err: unknown): boolean {
  return /^2[23]/.test(databaseCodeOf(err) ?? "");
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
 * Listens to every monitor's topic and stores the readings. Messages come at least once (QoS 1, a
 * kept session, so a broker holds them while no Lintel process listens), and each is acknowledged
 * to the broker only once it is stored: a process killed mid-way, or a database that is away,
 * leaves the message with the broker, which delivers it again. The client hands over one message
 * at a time and the next only after the acknowledgement, so the broker's queue is the only buffer
 * and a slow database slows delivery instead of filling memory. Storing is idempotent on monitor
 * and time, so a redelivery or an out-of-order message is stored once, in time order. A message
 * that is not a reading is counted and logged (topic and fields at fault, never the payload) and
 * never stops ingestion.
 */
export function createPressureIngest(options: PressureIngestOptions) {
  const { logger } = options;
  const now = options.now ?? (() => new Date());
  const retryMs = options.retryMs ?? 1_000;
  const lockRetryMs = options.lockRetryMs ?? 5_000;
  const prefix = options.mqtt.topicPrefix || defaultPressureTopicPrefix;
  const broker = safeBrokerAddress(options.mqtt.url);
  const counts: IngestCounts = { received: 0, stored: 0, duplicates: 0, future: 0, invalid: 0 };
  const listening = listeningClock(options.db);
  let storeFailing = false;

  /** A message received and not yet stored, with what tells the broker it is. */
  interface Waiting {
    reading: PressureReading | null;
    acknowledge: () => void;
  }

  let state = "stopped" as IngestState;
  let lockClient: pg.Client | null = null;
  let client: MqttClient | null = null;
  let lockTimer: NodeJS.Timeout | null = null;
  let retryTimer: NodeJS.Timeout | null = null;
  let pending: Waiting[] = [];
  let flushing: Promise<void> = Promise.resolve();
  let attempt: Promise<void> | null = null;
  const listeners = new Set<(state: IngestState) => void>();

  const setState = (next: IngestState) => {
    if (state === next) return;
    state = next;
    for (const listener of listeners) listener(next);
  };

  /**
   * Stores what is waiting, one message at a time (the client hands over no more than that), and
   * acknowledges each once stored; stores run one after another, never two at once. When the
   * database is away, nothing more is acknowledged and the store is tried again soon.
   */
  function flush(): Promise<void> {
    if (retryTimer) clearTimeout(retryTimer);
    retryTimer = null;
    flushing = flushing.then(async () => {
      while (pending.length > 0) {
        const waiting = pending[0]!;
        const at = now();
        let outcome: StoreOutcome | null;
        try {
          outcome = await storeOne(waiting, at);
        } catch (err) {
          // If this process stops meanwhile, the broker delivers the message to the next one.
          logger.warn(
            { err: { message: (err as Error).message }, waiting: pending.length },
            "pressure readings could not be stored yet; retrying",
          );
          if (state !== "stopped") retryTimer ??= setTimeout(() => void flush(), retryMs);
          storeFailing = true;
          return;
        }
        // The database is back: what the broker held meanwhile is only now arriving.
        if (storeFailing) listening.begin(at);
        storeFailing = false;
        pending.shift();
        waiting.acknowledge();
        if (outcome) await afterStored(outcome, at);
      }
    });
    return flushing;
  }

  /**
   * Stores one message's reading, or counts it invalid. A reading the database itself refuses as
   * data (an SQLSTATE of class 22 or 23, which the message checks should never let through) is
   * counted invalid too, so one bad message cannot hold up every later one.
   */
  async function storeOne(waiting: Waiting, at: Date): Promise<StoreOutcome | null> {
    if (waiting.reading) {
      try {
        return await storeReadings(options.db, [waiting.reading], { source: "mqtt", now: at });
      } catch (err) {
        if (!refusedAsData(err)) throw err;
        logger.error(
          { err: { message: (err as Error).message }, monitor: waiting.reading.monitorId },
          "pressure reading refused by the database; counted as invalid",
        );
        counts.invalid += 1;
      }
    }
    await tally(options.db, { source: "mqtt", now: at }, { invalid: 1 });
    return null;
  }

  async function afterStored(outcome: StoreOutcome, at: Date) {
    counts.stored += outcome.stored;
    counts.duplicates += outcome.duplicates;
    counts.future += outcome.future.length;
    if (outcome.future.length > 0)
      logger.warn(
        { future: outcome.future.length, monitor: outcome.future[0]!.monitorId },
        "pressure reading dated in the future refused (check the monitor's clock)",
      );
    if (outcome.inserted.length > 0 && options.onStored) {
      try {
        await options.onStored(outcome.inserted, at);
      } catch (err) {
        logger.error({ err }, "after storing pressure readings, the alarm hook failed");
      }
    }
  }

  /** The client's hook for each incoming message; `done` sends the acknowledgement. */
  function onMessage(packet: IPublishPacket, done: () => void) {
    counts.received += 1;
    const payload = Buffer.isBuffer(packet.payload) ? packet.payload : Buffer.from(packet.payload);
    const parsed = parsePressureMessage(packet.topic, payload, prefix);
    if (!parsed.ok) {
      counts.invalid += 1;
      // The topic and what is wrong, by field; the payload itself may carry a gateway's secrets.
      logger.warn({ topic: packet.topic, problems: parsed.problems }, "pressure message refused");
    }
    pending.push({ reading: parsed.ok ? parsed.reading : null, acknowledge: () => done() });
    void flush();
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
      // The broker hands over what it kept for this session while Lintel was not listening.
      listening.begin(now());
      logger.info({ broker }, "pressure ingest connected to the broker");
      next.subscribe(pressureTopicFilter(prefix), { qos: 1 }, (err) => {
        if (err)
          logger.error(
            { err: { message: err.message }, broker },
            "pressure topic subscribe failed",
          );
      });
    });
    next.handleMessage = onMessage;
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

  /**
   * Lets the store under way finish and be acknowledged, then leaves the broker. Whatever is not
   * stored by then stays unacknowledged, and the broker keeps it for the next process.
   */
  async function stopListening() {
    const listening = client;
    await flush();
    client = null;
    pending = [];
    if (retryTimer) clearTimeout(retryTimer);
    retryTimer = null;
    if (listening) await listening.endAsync().catch(() => undefined);
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
