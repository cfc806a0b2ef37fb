import { randomUUID } from "node:crypto";

import type { Logger } from "pino";

import {
  analysePressure,
  type ExcursionPolicy,
  type PressureExcursion,
  type SilentPeriod,
} from "@shared/calc/pressure-excursions";
import { defaultChecklists } from "@shared/checklists/defaults";

import type { Database, Tx } from "../../db/client";
import type { Env } from "../../env";
import type { Actor } from "../../lib/change-log";
import { isDatabaseUnavailable } from "../../lib/database-errors";
import { enqueueMail } from "../../outbox/outbox.repository";
import { listeningClock } from "./listening";
import { recordPressureFinding, type FailedItem } from "../actions/actions.service";
import { checklistItemsOf, latestPublishedVersion } from "../checklists/checklists.service";
import * as mails from "./alarms.emails";
import * as repo from "./alarms.repository";
import { alarmRecipients, sitePolicy } from "./settings.service";

/** What the alarm job needs of the app (AppDeps fits). */
export interface AlarmJobDeps {
  db: Database;
  env: Env;
  notifyOutbox: () => void;
}

export interface AlarmRound {
  /** Monitors looked at. */
  monitors: number;
  /** Monitors whose alarms changed (locked and written). */
  changed: number;
  /** E-mails queued: alarm notices and corrective-action assignments. */
  queued: number;
}

const system: Actor = { userId: null, requestId: null };

/** The checklist item a critical excursion is a finding on, by kind of room. */
export const pressureItemKeys: Partial<Record<repo.WatchedMonitor["zoneType"], string>> = {
  isolation_room: "room.pressure",
  anteroom: "ante.pressure",
};

/** The space page, where the room's live value and excursion log are. */
export const spacePageLink = (env: Env, spaceId: string) =>
  new URL(`/spaces/${encodeURIComponent(spaceId)}/audits`, env.publicUrl).toString();

function thresholdWords(policy: ExcursionPolicy): string {
  const pa = policy.threshold.value;
  return `${mails.formatPressure(pa, "Pa")} or lower`;
}

/**
 * How far back to read before the last judged moment: a stretch out of range may still be short
 * of its door grace there, and may continue over any gap shorter than the silence limit.
 */
function lookBackMs(policy: ExcursionPolicy): number {
  return policy.doorGraceMs + policy.silenceMs + policy.mergeGapMs + policy.graceMs;
}

interface Snapshot {
  monitor: repo.WatchedMonitor;
  policy: ExcursionPolicy;
  excursions: PressureExcursion[];
  silences: SilentPeriod[];
  rows: repo.AlarmRow[];
  lastReadingAt: Date | null;
}

/**
 * Reads what the monitors' alarms are decided from, as of `now`: a few statements for any
 * number of monitors (the round after every ingest must stay cheap).
 */
async function snapshotsOf(
  db: Database | Tx,
  monitors: readonly repo.WatchedMonitor[],
  now: Date,
  listeningSince: Date | undefined,
): Promise<Snapshot[]> {
  if (monitors.length === 0) return [];
  const openSince = await repo.earliestOpenAlarms(
    db,
    monitors.map((monitor) => monitor.id),
  );
  const plans = monitors.map((monitor) => {
    const policy = sitePolicy(monitor);
    // Alarms start no earlier than the mapping: what the monitor said before was no one's concern.
    const watchingSince = monitor.createdAt;
    let from = new Date((monitor.evaluatedThrough ?? watchingSince).getTime() - lookBackMs(policy));
    const open = openSince.get(monitor.id);
    if (open && open < from) from = open;
    if (from < watchingSince) from = watchingSince;
    return { monitor, policy, from, watchingSince };
  });
  const windows = plans.map((plan) => ({
    monitorId: plan.monitor.monitorId,
    from: plan.from,
    notBefore: plan.watchingSince,
  }));
  // One after another: inside a transaction they share one connection.
  const readings = await repo.readingsInWindows(db, windows, now);
  const before = await repo.readingsBeforeWindows(db, windows);
  // Alarms that ended a little before a window too: the reading before it may overlap them.
  const earliest = Math.min(
    ...plans.map((plan) => plan.from.getTime() - plan.policy.silenceMs - plan.policy.mergeGapMs),
  );
  const rows = await repo.alarmsOfMonitorsSince(
    db,
    monitors.map((monitor) => monitor.id),
    new Date(earliest),
  );
  return plans.map(({ monitor, policy, watchingSince }) => {
    const previous = before.get(monitor.monitorId);
    const inWindow = readings.get(monitor.monitorId) ?? [];
    const all = previous ? [previous, ...inWindow] : inWindow;
    // Without a reading before the window, the window reaches back to the mapping.
    const analysis = analysePressure(
      all,
      now,
      policy,
      previous ? { listeningSince } : { watchingSince, listeningSince },
    );
    return {
      monitor,
      policy,
      excursions: analysis.excursions,
      silences: analysis.silences,
      rows: rows.filter((row) => row.monitorRowId === monitor.id),
      lastReadingAt: analysis.lastReading?.measuredAt ?? null,
    };
  });
}

const overlaps = (row: repo.AlarmRow, start: Date, end: Date | null) =>
  row.startedAt.getTime() <= (end?.getTime() ?? Infinity) &&
  (row.endedAt?.getTime() ?? Infinity) >= start.getTime();

type Step =
  | { kind: "excursion"; excursion: PressureExcursion; row: repo.AlarmRow | null }
  | { kind: "silence"; silence: SilentPeriod; row: repo.AlarmRow | null };

/** What has to be written for the snapshot; empty when the stored alarms already say it all. */
function stepsOf(snapshot: Snapshot): Step[] {
  const steps: Step[] = [];
  const { rows } = snapshot;
  for (const excursion of snapshot.excursions) {
    const row =
      rows.find(
        (candidate) =>
          candidate.kind === "out_of_range" && overlaps(candidate, excursion.start, excursion.end),
      ) ?? null;
    // An ended alarm is history: later readings never reopen it or mail again.
    if (row?.endedAt) continue;
    if (
      !row ||
      worse(excursion, row) ||
      (excursion.critical && !row.criticalAt) ||
      excursion.status === "closed"
    )
      steps.push({ kind: "excursion", excursion, row });
  }
  for (const silence of snapshot.silences) {
    const row =
      rows.find(
        (candidate) =>
          candidate.kind === "no_readings" && overlaps(candidate, silence.from, silence.to),
      ) ?? null;
    if (row?.endedAt) continue;
    if (!row || silence.to !== null) steps.push({ kind: "silence", silence, row });
  }
  return steps;
}

function worse(excursion: PressureExcursion, row: repo.AlarmRow): boolean {
  return row.worstPa === null || excursion.worst.pascals > row.worstPa;
}

async function pressureItem(
  tx: Tx,
  monitor: repo.WatchedMonitor,
): Promise<Omit<FailedItem, "note"> | null> {
  const key = pressureItemKeys[monitor.zoneType];
  if (!key) return null;
  const version = await latestPublishedVersion(tx, monitor.networkId, monitor.zoneType);
  const items = version ? await checklistItemsOf(tx, version.id) : [];
  const item =
    items.find((candidate) => candidate.key === key) ??
    defaultChecklists[monitor.zoneType].items.find((candidate) => candidate.key === key);
  if (!item) return null;
  return {
    itemId: "id" in item && typeof item.id === "string" ? item.id : randomUUID(),
    key,
    text: item.text,
    severity: "critical",
  };
}

/** Writes the steps for one monitor inside its lock; returns the e-mails queued. */
/** Silences that started or ended in a round, gathered for one e-mail per site. */
interface SilenceDigest {
  started: mails.SilenceDigestRoom[];
  ended: mails.SilenceDigestRoom[];
}

async function applySteps(
  tx: Tx,
  deps: AlarmJobDeps,
  snapshot: Snapshot,
  steps: Step[],
  now: Date,
  digest?: SilenceDigest,
): Promise<number> {
  const { monitor, policy } = snapshot;
  let recipients: repo.Person[] | null = null;
  let queued = 0;
  const link = spacePageLink(deps.env, monitor.spaceId);
  const tell = async (
    build: (facts: mails.AlarmMailFacts) => ReturnType<typeof mails.alarmStartedMail>,
    facts: Omit<mails.AlarmMailFacts, "to" | "name">,
  ) => {
    recipients ??= await alarmRecipients(tx, monitor.siteId);
    for (const person of recipients) {
      await enqueueMail(tx, build({ ...facts, to: person.email, name: person.name }), person);
      queued += 1;
    }
  };
  const common = {
    roomName: monitor.spaceName,
    siteName: monitor.siteName,
    timeZone: monitor.timeZone,
    thresholdWords: thresholdWords(policy),
    link,
  };

  for (const step of steps) {
    if (step.kind === "silence") {
      const { silence } = step;
      let row = step.row;
      const facts = { ...common, kind: "no_readings" as const, since: silence.from, worst: null };
      if (!row) {
        row = await repo.insertAlarm(tx, {
          monitorRowId: monitor.id,
          monitorId: monitor.monitorId,
          siteId: monitor.siteId,
          spaceId: monitor.spaceId,
          kind: "no_readings",
          startedAt: silence.from,
          alarmAt: new Date(silence.from.getTime() + policy.silenceMs),
          startMailedAt: now,
        });
        if (!row) continue;
        if (digest)
          digest.started.push({ roomName: monitor.spaceName, since: silence.from, endedAt: null });
        else await tell(mails.alarmStartedMail, facts);
      }
      if (silence.to !== null) {
        await repo.updateAlarm(tx, row.id, { endedAt: silence.to, endMailedAt: now });
        if (digest)
          digest.ended.push({
            roomName: monitor.spaceName,
            since: row.startedAt,
            endedAt: silence.to,
          });
        else
          await tell(
            (full) => mails.alarmEndedMail({ ...full, endedAt: silence.to!, endedBy: "recovered" }),
            facts,
          );
      }
      continue;
    }

    const { excursion } = step;
    let row = step.row;
    const worst = excursion.worst;
    if (!row) {
      row = await repo.insertAlarm(tx, {
        monitorRowId: monitor.id,
        monitorId: monitor.monitorId,
        siteId: monitor.siteId,
        spaceId: monitor.spaceId,
        kind: "out_of_range",
        startedAt: excursion.start,
        alarmAt: excursion.alarmAt,
        worstValue: worst.pressure,
        worstUnit: worst.unit,
        worstPa: worst.pascals,
        worstAt: worst.measuredAt,
        startMailedAt: now,
      });
      if (!row) continue;
      await tell(mails.alarmStartedMail, {
        ...common,
        kind: "out_of_range",
        since: excursion.start,
        worst: { value: worst.pressure, unit: worst.unit },
      });
    } else if (worse(excursion, row)) {
      await repo.updateAlarm(tx, row.id, {
        worstValue: worst.pressure,
        worstUnit: worst.unit,
        worstPa: worst.pascals,
        worstAt: worst.measuredAt,
      });
      row = { ...row, worstValue: worst.pressure, worstUnit: worst.unit, worstPa: worst.pascals };
    }

    if (excursion.critical && !row.criticalAt) {
      const item = await pressureItem(tx, monitor);
      const limitMinutes = Math.round(policy.actionLimitMs / 60_000);
      const actionId = item
        ? await recordPressureFinding(
            tx,
            deps.env,
            { id: row.id, siteId: monitor.siteId, spaceId: monitor.spaceId },
            {
              ...item,
              note: `Room pressure out of range for longer than ${limitMinutes} min, from ${excursion.start.toISOString()}; worst ${mails.formatPressure(worst.pressure, worst.unit)} (live monitor ${monitor.monitorId}).`,
            },
            system,
            now,
          )
        : null;
      await repo.updateAlarm(tx, row.id, { criticalAt: excursion.criticalAt, actionId });
      if (actionId) queued += 1;
    }

    if (excursion.status === "closed" && excursion.end) {
      const worstValue = row.worstPa !== null && row.worstPa > worst.pascals ? row : null;
      const shown = worstValue
        ? { value: worstValue.worstValue!, unit: worstValue.worstUnit! }
        : { value: worst.pressure, unit: worst.unit };
      await repo.updateAlarm(tx, row.id, { endedAt: excursion.end, endMailedAt: now });
      await tell(
        (full) =>
          mails.alarmEndedMail({ ...full, endedAt: excursion.end!, endedBy: excursion.endedBy }),
        { ...common, kind: "out_of_range", since: row.startedAt, worst: shown },
      );
    }
  }
  return queued;
}

/**
 * Locks one monitor (`FOR UPDATE` on its row), reads it again and writes what changed; null when
 * there was nothing to write after all (another round wrote it, or its room was retired). The
 * number is the e-mails queued.
 */
async function writeMonitor(
  tx: Tx,
  deps: AlarmJobDeps,
  monitorRowId: string,
  now: Date,
  listeningSince: Date | undefined,
  digest?: SilenceDigest,
): Promise<number | null> {
  const locked = await repo.lockMonitor(tx, monitorRowId);
  if (!locked || locked.spaceRetiredAt) return null;
  const [snapshot] = await snapshotsOf(tx, [locked], now, listeningSince);
  const steps = stepsOf(snapshot!);
  if (steps.length === 0) return null;
  return applySteps(tx, deps, snapshot!, steps, now, digest);
}

/** From this many rooms of one site changing silence in a round, one e-mail tells of them all. */
export const silenceDigestFrom = 3;

/**
 * A site's monitors with silences to write, in one transaction: each locked in id order (so two
 * rounds at once never deadlock), read again and written as alone, except that the silences'
 * e-mails are gathered into one "started" and one "ended" e-mail per recipient, queued in the
 * same transaction as the alarms they tell of.
 */
async function digestRound(
  deps: AlarmJobDeps,
  group: readonly Snapshot[],
  now: Date,
  listeningSince: Date | undefined,
): Promise<{ queued: number; changed: number }> {
  return deps.db.transaction(async (tx) => {
    const digest: SilenceDigest = { started: [], ended: [] };
    let queued = 0;
    let changed = 0;
    const sorted = [...group].sort((a, b) => a.monitor.id.localeCompare(b.monitor.id));
    for (const first of sorted) {
      const written = await writeMonitor(tx, deps, first.monitor.id, now, listeningSince, digest);
      if (written === null) continue;
      changed += 1;
      queued += written;
    }
    const { siteId, siteName, timeZone } = group[0]!.monitor;
    const link = new URL(`/sites/${encodeURIComponent(siteId)}`, deps.env.publicUrl).toString();
    const recipients = await alarmRecipients(tx, siteId);
    for (const kind of ["started", "ended"] as const) {
      const rooms = digest[kind];
      if (rooms.length === 0) continue;
      // Fewer than the digest's size after all (another round wrote some): still one e-mail.
      for (const person of recipients) {
        await enqueueMail(
          tx,
          mails.silenceDigestMail({
            to: person.email,
            name: person.name,
            kind,
            siteName,
            timeZone,
            rooms: [...rooms].sort((a, b) => a.roomName.localeCompare(b.roomName)),
            link,
          }),
          person,
        );
        queued += 1;
      }
    }
    return { queued, changed };
  });
}

/**
 * Decides each mapped monitor's alarms as of `now` from its readings (the readings' own
 * timestamps) and writes what changed: new alarms with their start e-mail, ends with their end
 * e-mail, a critical finding past the site's action limit. Cheap when nothing changed: the
 * monitor is read without a lock, and only a monitor with something to write is locked
 * (`FOR UPDATE` on its row), read again and written, so two rounds at once never mail twice.
 * A retired room's open alarms end at its retirement, quietly; its monitor raises no more.
 */
export async function evaluatePressureAlarms(
  deps: AlarmJobDeps,
  options: {
    now: Date;
    monitorIds?: readonly string[];
    /** When this process began (again) to receive readings: see `listeningClock`. */
    listeningSince?: Date;
  },
): Promise<AlarmRound> {
  const { now, listeningSince } = options;
  const monitors = await repo.watchedMonitors(deps.db, options.monitorIds);
  const round: AlarmRound = { monitors: monitors.length, changed: 0, queued: 0 };
  const retired = monitors.filter((monitor) => monitor.spaceRetiredAt);
  if (retired.length > 0) {
    const open = await repo.earliestOpenAlarms(
      deps.db,
      retired.map((monitor) => monitor.id),
    );
    for (const monitor of retired.filter((candidate) => open.has(candidate.id))) {
      await repo.endAlarmsOfRetiredSpace(deps.db, monitor.id, monitor.spaceRetiredAt!);
      round.changed += 1;
    }
  }
  const snapshots = await snapshotsOf(
    deps.db,
    monitors.filter((monitor) => !monitor.spaceRetiredAt),
    now,
    listeningSince,
  );
  // Several rooms of a site falling silent (or reporting again) in the same round are written
  // together and told in one e-mail per recipient: usually one fault, the gateway's.
  const bySite = new Map<string, Snapshot[]>();
  for (const snapshot of snapshots) {
    if (!stepsOf(snapshot).some((step) => step.kind === "silence")) continue;
    const group = bySite.get(snapshot.monitor.siteId) ?? [];
    group.push(snapshot);
    bySite.set(snapshot.monitor.siteId, group);
  }
  const together = new Set<string>();
  for (const group of bySite.values()) {
    if (group.length < silenceDigestFrom) continue;
    const { queued, changed } = await digestRound(deps, group, now, listeningSince);
    round.queued += queued;
    round.changed += changed;
    for (const snapshot of group) together.add(snapshot.monitor.id);
  }

  for (const first of snapshots) {
    if (together.has(first.monitor.id) || stepsOf(first).length === 0) continue;
    const written = await deps.db.transaction((tx) =>
      writeMonitor(tx, deps, first.monitor.id, now, listeningSince),
    );
    if (written === null) continue;
    round.changed += 1;
    round.queued += written;
  }
  await repo.markManyEvaluated(
    deps.db,
    snapshots.flatMap(({ monitor, lastReadingAt }) =>
      lastReadingAt && (!monitor.evaluatedThrough || lastReadingAt > monitor.evaluatedThrough)
        ? [{ id: monitor.id, through: lastReadingAt }]
        : [],
    ),
  );
  if (round.queued > 0) deps.notifyOutbox();
  return round;
}

/** For the ingest's `onStored` hook: judges the monitors that just got readings. */
export function alarmsAfterStoring(deps: AlarmJobDeps) {
  return (inserted: readonly { monitorId: string }[]) =>
    inserted.length === 0
      ? Promise.resolve(null)
      : evaluatePressureAlarms(deps, {
          now: new Date(),
          monitorIds: [...new Set(inserted.map((reading) => reading.monitorId))],
        });
}

export interface AlarmTimerOptions extends AlarmJobDeps {
  logger: Logger;
  intervalMs: number;
}

/**
 * Runs the alarm job for every monitor on a timer, so that silences and ends are noticed without
 * new readings. One round at a time in this process; rounds in other processes are kept apart
 * by the monitor's row lock.
 */
export function createPressureAlarmTimer(options: AlarmTimerOptions) {
  let timer: NodeJS.Timeout | null = null;
  let round: Promise<unknown> | null = null;
  let databaseAway = false;

  const listening = listeningClock(options.db);

  async function safeRound() {
    try {
      await evaluatePressureAlarms(options, {
        now: new Date(),
        listeningSince: listening.since(),
      });
      // Back after the database was away: readings held meanwhile are only now arriving.
      if (databaseAway) listening.begin(new Date());
      databaseAway = false;
    } catch (error) {
      if (!isDatabaseUnavailable(error)) {
        options.logger.error({ err: error }, "room-pressure alarm round failed");
      } else if (!databaseAway) {
        databaseAway = true;
        options.logger.warn("database unreachable; room-pressure alarms wait until it is back");
      }
    }
  }

  return {
    start() {
      if (timer) return;
      round = safeRound();
      timer = setInterval(() => {
        round = (round ?? Promise.resolve()).then(safeRound);
      }, options.intervalMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await round;
      round = null;
    },
  };
}
