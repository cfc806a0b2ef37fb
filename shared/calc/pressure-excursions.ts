/**
 * Excursions of a room's pressure, decided from a monitor's readings on the readings' own
 * timestamps, and the one-minute and one-hour roll-ups the storage keeps. Pure functions: the
 * clock is an argument, nothing is read from the machine.
 *
 * The room is judged reading by reading with `meetsPressureThreshold`, in the unit the monitor
 * reports, exactly as an audit judges a pressure reading. Between two readings the room is taken
 * to stay as the earlier one showed, but never across a silence: a monitor that says nothing for
 * `silenceMs` raises its own "no readings" alarm instead.
 */
import type { DoorState, PressureUnit } from "../schemas/pressure-readings";

import { meetsPressureThreshold, toSi, type Threshold } from "./answer-rules";
import { minimumNegativePressurePascals } from "./ventilation";

/** What the calculations need of a reading (a `PressureReading` fits). */
export interface PressureSample {
  monitorId: string;
  measuredAt: Date;
  pressure: number;
  unit: PressureUnit;
  door: DoorState | null;
}

export interface ExcursionPolicy {
  /** In Pa; judged at the figure stated in the monitor's unit (−2.5 Pa or −0.01 in. w.c.). */
  threshold: Threshold;
  /** Out of range for longer than this with the door closed (or not reported): an excursion. */
  graceMs: number;
  /** Out of range for longer than this in all, while the door reports open part of the time. */
  doorGraceMs: number;
  /** Excursions that start less than this after the previous one ended are one excursion. */
  mergeGapMs: number;
  /** An excursion longer than this is critical: a finding on the room's pressure item. */
  actionLimitMs: number;
  /** No reading for this long is a "no readings" alarm. */
  silenceMs: number;
}

const second = 1000;
const minute = 60 * second;
const hour = 60 * minute;

/**
 * Lintel's defaults. The threshold is the CDC's airborne-isolation differential (2.5 Pa, 0.01 in.
 * w.c., negative to the corridor). The door grace is a Lintel default (common practice, no
 * published figure): long enough for a person and a cart to pass, short of a door propped open.
 */
export const defaultExcursionPolicy: ExcursionPolicy = {
  threshold: { op: "<=", value: -minimumNegativePressurePascals },
  graceMs: 60 * second,
  doorGraceMs: 5 * minute,
  mergeGapMs: 2 * minute,
  actionLimitMs: 15 * minute,
  silenceMs: 10 * minute,
};

/** The defaults with a room's or site's own settings over them; refuses settings with no meaning. */
export function excursionPolicy(overrides: Partial<ExcursionPolicy> = {}): ExcursionPolicy {
  const policy = { ...defaultExcursionPolicy, ...overrides };
  for (const key of [
    "graceMs",
    "doorGraceMs",
    "mergeGapMs",
    "actionLimitMs",
    "silenceMs",
  ] as const) {
    const value = policy[key];
    if (!Number.isFinite(value) || value < 0) throw new RangeError(`${key} must be zero or more.`);
  }
  if (!Number.isFinite(policy.threshold.value))
    throw new RangeError("The threshold must be a number.");
  if (policy.doorGraceMs < policy.graceMs)
    throw new RangeError("The door grace cannot be shorter than the grace.");
  if (policy.silenceMs <= 0) throw new RangeError("silenceMs must be above zero.");
  return policy;
}

/** The reading furthest from the threshold on the wrong side. */
export interface WorstReading {
  measuredAt: Date;
  pressure: number;
  unit: PressureUnit;
  pascals: number;
}

export type ExcursionStatus =
  /** The room is still out of range as far as the readings show. */
  | "open"
  /** Back in range (or readings stopped), but an excursion starting soon enough would join it. */
  | "closing"
  /** Ended, and nothing later can join it. */
  | "closed";

export interface PressureExcursion {
  monitorId: string;
  /** The first reading out of range. */
  start: Date;
  /** When the grace ran out (the moment the room became an excursion). */
  alarmAt: Date;
  /** The first reading back in range, or the last out of range when readings stopped; null while open. */
  end: Date | null;
  endedBy: "recovered" | "readings_stopped" | null;
  status: ExcursionStatus;
  /** The last reading out of range. */
  lastOutAt: Date;
  /** end − start; while open, the last reading out of range − start. */
  durationMs: number;
  worst: WorstReading;
  /** Longer than the action limit. */
  critical: boolean;
  /** start + action limit, when critical. */
  criticalAt: Date | null;
}

/** A stretch of `silenceMs` or more without a reading. */
export interface SilentPeriod {
  /** The last reading before the silence (or when watching began, for a monitor never heard). */
  from: Date;
  /** The next reading; null while the monitor is still silent. */
  to: Date | null;
}

export type PressureNow =
  | "never_reported"
  | "no_readings"
  | "in_range"
  /** Out of range, still within the grace. */
  | "out_of_range"
  | "excursion";

export interface PressureAnalysis {
  /** Null when there are no readings to name it. */
  monitorId: string | null;
  excursions: PressureExcursion[];
  silences: SilentPeriod[];
  /** The current "no readings" alarm: since the last reading (or since watching began). */
  noReadingsSince: Date | null;
  now: PressureNow;
  lastReading: PressureSample | null;
}

const keyOf = (reading: PressureSample) =>
  `${reading.monitorId}\u0000${reading.measuredAt.getTime()}`;

/**
 * Readings as the storage keeps them: one per monitor and time (the first received wins, as the
 * storage's unique key keeps the first row), in time order. Out-of-order delivery gives the same
 * list; a redelivered reading is kept once.
 */
export function orderReadings<R extends PressureSample>(readings: readonly R[]): R[] {
  const kept = new Map<string, R>();
  for (const reading of readings) {
    if (!Number.isFinite(reading.measuredAt.getTime()))
      throw new RangeError("A reading has no valid time.");
    const key = keyOf(reading);
    if (!kept.has(key)) kept.set(key, reading);
  }
  return [...kept.values()].sort(
    (a, b) =>
      a.measuredAt.getTime() - b.measuredAt.getTime() ||
      (a.monitorId < b.monitorId ? -1 : a.monitorId > b.monitorId ? 1 : 0),
  );
}

/** Whether a reading meets the room's threshold, in the monitor's unit. */
export function readingInRange(reading: PressureSample, threshold: Threshold): boolean {
  return meetsPressureThreshold(reading.pressure, reading.unit, threshold);
}

/** How far past the threshold a reading is, in Pa (larger is worse). */
function badness(pascals: number, threshold: Threshold): number {
  return threshold.op === "<=" ? pascals : -pascals;
}

function worstOf(readings: readonly PressureSample[], threshold: Threshold): WorstReading {
  let worst: WorstReading | null = null;
  for (const reading of readings) {
    const pascals = toSi(reading.pressure, reading.unit);
    if (worst === null || badness(pascals, threshold) > badness(worst.pascals, threshold))
      worst = {
        measuredAt: reading.measuredAt,
        pressure: reading.pressure,
        unit: reading.unit,
        pascals,
      };
  }
  return worst!;
}

/** A run of readings out of range, from the first to the reading that ended it. */
interface Stretch {
  out: PressureSample[];
  end: number | null;
  endedBy: "recovered" | "readings_stopped" | null;
  alarmAt: number | null;
}

/**
 * Walks the readings into stretches out of range. Time between two readings counts as the
 * earlier reading showed (its value and its door); the ordinary grace counts only time with the
 * door closed or not reported, the door grace all of it, so a door held open does not hide a room
 * that stays positive once the door shuts.
 */
function stretchesOf(
  readings: readonly PressureSample[],
  nowMs: number,
  policy: ExcursionPolicy,
  heardSince: (lastMs: number) => number,
): Stretch[] {
  const stretches: Stretch[] = [];
  let current: (Stretch & { closedMs: number; totalMs: number }) | null = null;

  const close = (end: number, endedBy: "recovered" | "readings_stopped") => {
    current!.end = end;
    current!.endedBy = endedBy;
    stretches.push(current!);
    current = null;
  };

  for (const reading of readings) {
    const at = reading.measuredAt.getTime();
    const inRange = readingInRange(reading, policy.threshold);
    if (current !== null) {
      const last = current.out[current.out.length - 1]!;
      const from = last.measuredAt.getTime();
      const span = at - from;
      if (span >= policy.silenceMs) {
        close(from, "readings_stopped");
      } else {
        // The interval [from, at) as the last reading out of range showed it.
        const candidates: number[] = [];
        if (last.door !== "open" && current.closedMs + span > policy.graceMs)
          candidates.push(from + (policy.graceMs - current.closedMs));
        if (current.totalMs + span > policy.doorGraceMs)
          candidates.push(from + (policy.doorGraceMs - current.totalMs));
        if (current.alarmAt === null && candidates.length > 0)
          current.alarmAt = Math.max(from, Math.min(...candidates));
        current.totalMs += span;
        if (last.door !== "open") current.closedMs += span;
        if (inRange) close(at, "recovered");
        else current.out.push(reading);
        continue;
      }
    }
    if (!inRange)
      current = {
        out: [reading],
        end: null,
        endedBy: null,
        alarmAt: null,
        closedMs: 0,
        totalMs: 0,
      };
  }
  if (current !== null) {
    const last = (current as Stretch).out.at(-1)!.measuredAt.getTime();
    if (nowMs - heardSince(last) >= policy.silenceMs) close(last, "readings_stopped");
    else stretches.push(current);
  }
  return stretches;
}

function assertOneMonitor(readings: readonly PressureSample[]): string | null {
  const ids = new Set(readings.map((reading) => reading.monitorId));
  if (ids.size > 1) throw new RangeError("Analyse one monitor's readings at a time.");
  return readings[0]?.monitorId ?? null;
}

export interface AnalyseOptions {
  /** When the monitor was mapped to the room: a monitor never heard from since is silent. */
  watchingSince?: Date;
  /**
   * When Lintel began, or began again, to receive readings (after a restart, or the database or
   * the broker back). A silence that may be Lintel's own is not the monitor's: at `now`, the
   * silence limit counts from the later of the last reading and this, so a backlog still arriving
   * raises no "no readings" alarm and ends no excursion. Gaps between readings are unaffected.
   */
  listeningSince?: Date;
}

/**
 * One monitor's excursions, silences and present state as of `now`, from its readings. Readings
 * dated after `now` are not yet known and are left out, so the answer for a past moment never
 * changes. Excursions are stretches out of range longer than the grace, joined when less than
 * `mergeGapMs` apart; each has its start, end (or none while open), duration and worst reading,
 * and is critical beyond the action limit.
 */
export function analysePressure(
  readings: readonly PressureSample[],
  now: Date,
  policy: ExcursionPolicy = defaultExcursionPolicy,
  options: AnalyseOptions = {},
): PressureAnalysis {
  const nowMs = now.getTime();
  if (!Number.isFinite(nowMs)) throw new RangeError("The clock must be a valid time.");
  const monitorId = assertOneMonitor(readings);
  const known = orderReadings(readings).filter((reading) => reading.measuredAt.getTime() <= nowMs);
  const listeningMs = options.listeningSince?.getTime();
  const heardSince = (lastMs: number) =>
    listeningMs !== undefined && Number.isFinite(listeningMs) && listeningMs <= nowMs
      ? Math.max(lastMs, listeningMs)
      : lastMs;
  const stretches = stretchesOf(known, nowMs, policy, heardSince);

  // Stretches past their grace are excursions; excursions less than mergeGapMs apart are one.
  const joined: { first: Stretch; last: Stretch }[] = [];
  const undecided = stretches.find((stretch) => stretch.end === null && stretch.alarmAt === null);
  for (const stretch of stretches) {
    if (stretch.alarmAt === null) continue;
    const previous = joined.at(-1);
    if (
      previous &&
      previous.last.end !== null &&
      stretch.out[0]!.measuredAt.getTime() - previous.last.end < policy.mergeGapMs
    ) {
      previous.last = stretch;
      continue;
    }
    joined.push({ first: stretch, last: stretch });
  }

  const excursions = joined.map(({ first, last }): PressureExcursion => {
    const startMs = first.out[0]!.measuredAt.getTime();
    const lastOutMs = last.out.at(-1)!.measuredAt.getTime();
    const durationMs = (last.end ?? lastOutMs) - startMs;
    const critical = durationMs > policy.actionLimitMs;
    // Every reading out of range from start to end, those of short stretches between included.
    const inside = stretches
      .filter((stretch) => {
        const at = stretch.out[0]!.measuredAt.getTime();
        return at >= startMs && at <= lastOutMs;
      })
      .flatMap((stretch) => stretch.out);
    let status: ExcursionStatus = "open";
    if (last.end !== null) {
      // A later excursion joins this one if it starts before end + mergeGapMs: until the clock is
      // past that, or a stretch that started in time is still short of its grace, it may.
      const joinBy = last.end + policy.mergeGapMs;
      const waiting = undecided !== undefined && undecided.out[0]!.measuredAt.getTime() < joinBy;
      status = nowMs < joinBy || waiting ? "closing" : "closed";
    }
    return {
      monitorId: first.out[0]!.monitorId,
      start: new Date(startMs),
      alarmAt: new Date(first.alarmAt!),
      end: last.end === null ? null : new Date(last.end),
      endedBy: last.endedBy,
      status,
      lastOutAt: new Date(lastOutMs),
      durationMs,
      worst: worstOf(inside, policy.threshold),
      critical,
      criticalAt: critical ? new Date(startMs + policy.actionLimitMs) : null,
    };
  });

  const silences = silencesOf(known, nowMs, policy, options.watchingSince, heardSince);
  const current = silences.at(-1);
  const noReadingsSince = current && current.to === null ? current.from : null;
  const lastReading = known.at(-1) ?? null;

  let state: PressureNow;
  if (noReadingsSince !== null) state = "no_readings";
  else if (lastReading === null) state = "never_reported";
  else if (excursions.at(-1)?.status === "open") state = "excursion";
  else if (!readingInRange(lastReading, policy.threshold)) state = "out_of_range";
  else state = "in_range";

  return { monitorId, excursions, silences, noReadingsSince, now: state, lastReading };
}

function silencesOf(
  readings: readonly PressureSample[],
  nowMs: number,
  policy: ExcursionPolicy,
  watchingSince: Date | undefined,
  heardSince: (lastMs: number) => number,
): SilentPeriod[] {
  const silences: SilentPeriod[] = [];
  const watchMs = watchingSince?.getTime();
  let previous = watchMs !== undefined && Number.isFinite(watchMs) ? watchMs : null;
  for (const reading of readings) {
    const at = reading.measuredAt.getTime();
    if (previous !== null && at - previous >= policy.silenceMs)
      silences.push({ from: new Date(previous), to: new Date(at) });
    previous = previous === null ? at : Math.max(previous, at);
  }
  if (previous !== null && nowMs - heardSince(previous) >= policy.silenceMs)
    silences.push({ from: new Date(previous), to: null });
  return silences;
}

// ---------------------------------------------------------------------------------------------
// Roll-ups

export type BucketSize = "minute" | "hour";

const bucketMs: Record<BucketSize, number> = { minute, hour };

/** A monitor's readings summed over one UTC minute or hour; Pa throughout. */
export interface PressureBucket {
  monitorId: string;
  bucketStart: Date;
  count: number;
  /** Kept so that buckets add up exactly: mean = sumPascals / count. */
  sumPascals: number;
  meanPascals: number;
  minPascals: number;
  maxPascals: number;
  /** Readings that did not meet the threshold. */
  outOfRangeCount: number;
  /**
   * Minutes out of range: in a one-minute bucket the share of its readings out of range (0 to 1);
   * in an hour, the sum over its minutes.
   */
  minutesOutOfRange: number;
  /** Minutes with at least one reading: 1 for a one-minute bucket, up to 60 for an hour. */
  minutesWithReadings: number;
}

/** The start of the UTC minute or hour a time falls in. */
export function bucketStartOf(at: Date, size: BucketSize): Date {
  const width = bucketMs[size];
  return new Date(Math.floor(at.getTime() / width) * width);
}

const bucketKey = (monitorId: string, start: Date) => `${monitorId}\u0000${start.getTime()}`;

function sortBuckets(buckets: Iterable<PressureBucket>): PressureBucket[] {
  return [...buckets].sort(
    (a, b) =>
      (a.monitorId < b.monitorId ? -1 : a.monitorId > b.monitorId ? 1 : 0) ||
      a.bucketStart.getTime() - b.bucketStart.getTime(),
  );
}

/**
 * One-minute roll-up of raw readings (any monitors), after the same de-duplication as the storage.
 * The threshold is the room's, as for excursions.
 */
export function rollUpMinutes(
  readings: readonly PressureSample[],
  threshold: Threshold = defaultExcursionPolicy.threshold,
): PressureBucket[] {
  const buckets = new Map<string, PressureBucket>();
  for (const reading of orderReadings(readings)) {
    const start = bucketStartOf(reading.measuredAt, "minute");
    const key = bucketKey(reading.monitorId, start);
    const pascals = toSi(reading.pressure, reading.unit);
    const out = readingInRange(reading, threshold) ? 0 : 1;
    const bucket = buckets.get(key);
    if (!bucket) {
      buckets.set(key, {
        monitorId: reading.monitorId,
        bucketStart: start,
        count: 1,
        sumPascals: pascals,
        meanPascals: pascals,
        minPascals: pascals,
        maxPascals: pascals,
        outOfRangeCount: out,
        minutesOutOfRange: out,
        minutesWithReadings: 1,
      });
      continue;
    }
    bucket.count += 1;
    bucket.sumPascals += pascals;
    bucket.meanPascals = bucket.sumPascals / bucket.count;
    bucket.minPascals = Math.min(bucket.minPascals, pascals);
    bucket.maxPascals = Math.max(bucket.maxPascals, pascals);
    bucket.outOfRangeCount += out;
    bucket.minutesOutOfRange = bucket.outOfRangeCount / bucket.count;
  }
  return sortBuckets(buckets.values());
}

/** One-hour roll-up from one-minute buckets, as the storage derives it. */
export function rollUpHours(minutes: readonly PressureBucket[]): PressureBucket[] {
  const buckets = new Map<string, PressureBucket>();
  for (const m of minutes) {
    const start = bucketStartOf(m.bucketStart, "hour");
    const key = bucketKey(m.monitorId, start);
    const bucket = buckets.get(key);
    if (!bucket) {
      buckets.set(key, { ...m, bucketStart: start });
      continue;
    }
    bucket.count += m.count;
    bucket.sumPascals += m.sumPascals;
    bucket.meanPascals = bucket.sumPascals / bucket.count;
    bucket.minPascals = Math.min(bucket.minPascals, m.minPascals);
    bucket.maxPascals = Math.max(bucket.maxPascals, m.maxPascals);
    bucket.outOfRangeCount += m.outOfRangeCount;
    bucket.minutesOutOfRange += m.minutesOutOfRange;
    bucket.minutesWithReadings += m.minutesWithReadings;
  }
  return sortBuckets(buckets.values());
}

/** Roll-up of raw readings at either size (the hour through its minutes). */
export function rollUp(
  readings: readonly PressureSample[],
  size: BucketSize,
  threshold: Threshold = defaultExcursionPolicy.threshold,
): PressureBucket[] {
  const minutes = rollUpMinutes(readings, threshold);
  return size === "minute" ? minutes : rollUpHours(minutes);
}
