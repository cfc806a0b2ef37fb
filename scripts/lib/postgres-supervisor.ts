import type { Cluster } from "./postgres";

export interface SupervisorOptions {
  cluster: Pick<Cluster, "isRunning" | "start" | "port">;
  /** One line per event: PostgreSQL stopped, started again, did not start. */
  log: (line: string) => void;
  /** How often to look whether PostgreSQL still runs. */
  checkEveryMs?: number;
  /** Waits after successive failed attempts (the first attempt is at once); the last repeats. */
  backoffMs?: readonly number[];
  /** At most this many start attempts within `windowMs`; beyond it, wait for the window. */
  maxAttempts?: number;
  windowMs?: number;
}

export interface Supervisor {
  /** Stop watching (before stopping PostgreSQL on purpose). */
  stop: () => Promise<void>;
  /** Start attempts made so far, successful or not. */
  attempts: () => number;
}

/**
 * Keeps `npm start`'s PostgreSQL running, as a service manager does in production: when the
 * postmaster has gone (crashed, killed, out of memory), log it and start it again, waiting longer
 * after each failed attempt and making at most `maxAttempts` attempts a minute. The app meanwhile
 * answers 503 and reconnects by itself once PostgreSQL is back.
 */
export function superviseCluster({
  cluster,
  log,
  checkEveryMs = 1_000,
  backoffMs = [1_000, 2_000, 5_000, 10_000],
  maxAttempts = 5,
  windowMs = 60_000,
}: SupervisorOptions): Supervisor {
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let current: Promise<void> = Promise.resolve();
  const attemptTimes: number[] = [];
  let attempts = 0;
  let failures = 0;
  let downSince: number | null = null;

  const wait = (ms: number) => {
    if (stopped) return;
    timer = setTimeout(() => {
      current = check();
    }, ms);
    timer.unref();
  };

  async function check(): Promise<void> {
    if (stopped) return;
    if (cluster.isRunning()) {
      wait(checkEveryMs);
      return;
    }
    const now = Date.now();
    if (downSince === null) {
      downSince = now;
      log(`PostgreSQL on port ${cluster.port} has stopped unexpectedly; starting it again.`);
    }
    while (attemptTimes.length > 0 && attemptTimes[0]! <= now - windowMs) attemptTimes.shift();
    if (attemptTimes.length >= maxAttempts) {
      const resumeIn = attemptTimes[0]! + windowMs - now;
      log(
        `PostgreSQL did not stay up (${maxAttempts} start attempts within ${Math.round(windowMs / 1000)} s); next attempt in ${Math.ceil(resumeIn / 1000)} s.`,
      );
      wait(resumeIn);
      return;
    }
    attemptTimes.push(now);
    attempts += 1;
    try {
      await cluster.start();
      log(`PostgreSQL is running again (down ${((Date.now() - downSince) / 1000).toFixed(1)} s).`);
      downSince = null;
      failures = 0;
      wait(checkEveryMs);
    } catch (error) {
      if (stopped) return;
      const delay = backoffMs[Math.min(failures, backoffMs.length - 1)] ?? checkEveryMs;
      failures += 1;
      const reason = (error instanceof Error ? error.message : String(error)).split("\n")[0];
      log(`PostgreSQL did not start: ${reason} Next attempt in ${Math.ceil(delay / 1000)} s.`);
      wait(delay);
    }
  }

  wait(checkEveryMs);
  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await current;
    },
    attempts: () => attempts,
  };
}
