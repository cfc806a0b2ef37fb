import type { Logger } from "pino";

import type { Database } from "../../db/client";
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
  logger: Logger;
  /** Tells the e-mail worker that new mail is waiting. */
  notifyOutbox: () => void;
}

/**
 * The one place new readings are handed on: the alarm job (excursions, e-mails, corrective
 * actions) is wired here, so ingestion itself knows nothing of alarms. Until it is, new readings
 * are only stored.
 */
export function createOnStored(deps: OnStoredDeps): OnStored {
  return async function onStored(inserted, now) {
    if (inserted.length === 0) return;
    // The alarm job goes here: e.g. `await evaluatePressureAlarms(deps, now)`.
    void deps;
    void now;
  };
}
