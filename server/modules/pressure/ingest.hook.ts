import type { Logger } from "pino";

import type { Database } from "../../db/client";
import type { Env } from "../../env";
import { evaluatePressureAlarms } from "./alarms.job";
import { listeningClock } from "./listening";
import type { StoreOutcome } from "./readings.repository";

/** The readings one batch actually inserted (never duplicates), in time order per monitor. */
export type StoredReadings = StoreOutcome["inserted"];

/**
 * Called after every batch that inserted readings, from the broker and from HTTP uploads alike,
 * with the time the batch was stored.
 */
export type OnStored = (inserted: StoredReadings, now: Date) => Promise<void>;

export interface OnStoredDeps {
  db: Database;
  env: Env;
  logger: Logger;
  /** Tells the e-mail worker that new mail is waiting. */
  notifyOutbox: () => void;
}

interface AlarmRunner {
  add(monitorIds: Iterable<string>, now: Date): void;
  /** Resolves once no round is running or waiting. */
  settled(): Promise<void>;
}

/** One runner per database handle, so every batch and upload of a process share it. */
const runners = new WeakMap<Database, AlarmRunner>();

/**
 * Alarm rounds for the monitors that have new readings, one round at a time: monitors whose
 * readings arrive while a round runs wait for the next, all together. A round for 500 monitors
 * takes longer than a batch of readings does to arrive, so rounds never queue up behind each
 * other and storing never waits for alarms.
 */
function alarmRunner(deps: OnStoredDeps): AlarmRunner {
  const waiting = new Set<string>();
  // The clock of the latest batch: the ingest's own, which tests set.
  let clock = new Date(0);
  let running: Promise<void> | null = null;
  async function loop() {
    while (waiting.size > 0) {
      const monitorIds = [...waiting];
      waiting.clear();
      try {
        await evaluatePressureAlarms(deps, {
          now: clock,
          monitorIds,
          listeningSince: listeningClock(deps.db).since(),
        });
      } catch (err) {
        // The timer's round picks the monitors up again: no reading is judged only once.
        deps.logger.error({ err }, "after storing pressure readings, the alarm round failed");
      }
    }
    running = null;
  }
  return {
    add(monitorIds, now) {
      for (const id of monitorIds) waiting.add(id);
      if (now > clock) clock = now;
      running ??= loop();
    },
    settled: async () => {
      while (running) await running;
    },
  };
}

function runnerFor(deps: OnStoredDeps): AlarmRunner {
  let runner = runners.get(deps.db);
  if (!runner) {
    runner = alarmRunner(deps);
    runners.set(deps.db, runner);
  }
  return runner;
}

/**
 * The one place new readings are handed on to the alarm job (excursions, e-mails, corrective
 * actions), so ingestion itself knows nothing of alarms. It returns at once: the round runs
 * beside the ingest, never in its way.
 */
export function createOnStored(deps: OnStoredDeps): OnStored {
  const runner = runnerFor(deps);
  return async function onStored(inserted, now) {
    // Another process runs the rounds (its timer picks these readings up).
    if (inserted.length === 0 || deps.env.LINTEL_PRESSURE_ALARMS === "0") return;
    runner.add(
      inserted.map((reading) => reading.monitorId),
      now,
    );
  };
}

/** Waits for the alarm rounds new readings started (a clean stop, and tests). */
export function alarmRoundsSettled(db: Database): Promise<void> {
  return runners.get(db)?.settled() ?? Promise.resolve();
}
