import type { Database } from "../../db/client";

/**
 * When this process began, or began again, to receive readings: at boot, and again whenever the
 * database or the broker comes back. The alarm rounds judge silences from it (`listeningSince` in
 * shared/calc/pressure-excursions.ts), so a backlog that is still arriving after Lintel's own
 * outage raises no "no readings" alarm for every room at once.
 */
export interface ListeningClock {
  since(): Date;
  /** Listening again from `at`. */
  begin(at: Date): void;
}

const clocks = new WeakMap<Database, ListeningClock>();

/** One clock per database handle, shared by the ingest, the alarm timer and upload rounds. */
export function listeningClock(db: Database): ListeningClock {
  let clock = clocks.get(db);
  if (!clock) {
    let since = new Date();
    clock = {
      since: () => since,
      begin(at) {
        since = at;
      },
    };
    clocks.set(db, clock);
  }
  return clock;
}
