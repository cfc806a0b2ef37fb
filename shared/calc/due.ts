import { TZDate } from "@date-fns/tz";
import { addDays, addHours, format } from "date-fns";

import type { Severity } from "./verdict";

/**
 * When a corrective action is due, from the site's policy by severity. Hours are elapsed hours
 * (24 hours is 24 hours even across a clock change); days are calendar days in the site's time
 * zone, ending at the same local time of day (7 days from 09:00 is 09:00, whether or not the
 * clocks changed in between). The defaults are common practice, not a published rule.
 */
export const dueUnits = ["hours", "days"] as const;
export type DueUnit = (typeof dueUnits)[number];

export interface DueRule {
  amount: number;
  unit: DueUnit;
}

export type DuePolicy = Record<Severity, DueRule>;

export const defaultDuePolicy: DuePolicy = {
  critical: { amount: 24, unit: "hours" },
  major: { amount: 7, unit: "days" },
  minor: { amount: 30, unit: "days" },
};

/** The longest a policy may allow, so a typing slip does not hide an action for years. */
export const maxDueAmount: Record<DueUnit, number> = { hours: 24 * 90, days: 365 };

function assertRule(rule: DueRule): void {
  if (!Number.isInteger(rule.amount) || rule.amount < 1 || rule.amount > maxDueAmount[rule.unit]) {
    throw new RangeError(
      `A due time is a whole number of ${rule.unit} from 1 to ${maxDueAmount[rule.unit]}.`,
    );
  }
}

function assertInstant(date: Date, what: string): void {
  if (!(date instanceof Date) || Number.isNaN(date.getTime()))
    throw new RangeError(`${what} must be a valid date.`);
}

/** The due instant of an action opened at `openedAt` at a site in `timeZone` (IANA name). */
export function dueAt(
  openedAt: Date,
  severity: Severity,
  policy: DuePolicy,
  timeZone: string,
): Date {
  assertInstant(openedAt, "The opening time");
  const rule = policy[severity];
  assertRule(rule);
  if (rule.unit === "hours") return addHours(openedAt, rule.amount);
  // TZDate does calendar arithmetic on the site's wall clock; a local time that does not exist on
  // the due day (clocks went forward) moves forward by the gap, as the clock on the wall would.
  const local = addDays(new TZDate(openedAt.getTime(), timeZone), rule.amount);
  return new Date(local.getTime());
}

const hour = 60 * 60 * 1000;
const day = 24 * hour;

/** Notices about time: a day before due, once when overdue, then every seven days. */
export const dueSoonLeadMs = 24 * hour;
export const reminderEveryMs = 7 * day;

export function isOverdue(due: Date, now: Date, closed: boolean): boolean {
  return !closed && now.getTime() > due.getTime();
}

/**
 * Whether the "due tomorrow" notice applies now: inside the last day before due, and only when the
 * action had more than that day to begin with (a 24-hour action is told its due time when assigned).
 */
export function dueSoonApplies(openedAt: Date, due: Date, now: Date): boolean {
  const from = due.getTime() - dueSoonLeadMs;
  return openedAt.getTime() < from && now.getTime() >= from && now.getTime() <= due.getTime();
}

/**
 * Which weekly reminder is due now, counted from when the overdue notice went out (1 for the
 * first week after it); 0 when none is. After downtime only the latest is sent, never a backlog.
 */
export function reminderNumber(overdueNoticeAt: Date, now: Date): number {
  const elapsed = now.getTime() - overdueNoticeAt.getTime();
  return elapsed < reminderEveryMs ? 0 : Math.floor(elapsed / reminderEveryMs);
}

/** Elapsed days from opening to closing, to one decimal. */
export function daysToClose(openedAt: Date, closedAt: Date): number {
  assertInstant(openedAt, "The opening time");
  assertInstant(closedAt, "The closing time");
  if (closedAt.getTime() < openedAt.getTime())
    throw new RangeError("An action cannot close before it opened.");
  return Math.round(((closedAt.getTime() - openedAt.getTime()) / day) * 10) / 10;
}

const zoneNameFormats = new Map<string, Intl.DateTimeFormat>();

/** The due time as the site's clock shows it, e.g. "Tue 31 Mar 2026, 09:00 BST". */
export function formatInZone(date: Date, timeZone: string): string {
  const local = format(new TZDate(date.getTime(), timeZone), "EEE d MMM yyyy, HH:mm");
  // Making a formatter is costly and exports format many rows in few zones: keep one per zone.
  let names = zoneNameFormats.get(timeZone);
  if (!names) {
    names = new Intl.DateTimeFormat("en-GB", { timeZone, timeZoneName: "short" });
    zoneNameFormats.set(timeZone, names);
  }
  const zoneName =
    names.formatToParts(date).find((part) => part.type === "timeZoneName")?.value ?? timeZone;
  return `${local} ${zoneName}`;
}
