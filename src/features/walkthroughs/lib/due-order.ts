import type { ScheduleEntry } from "@shared/schemas/audits";

const stateRank: Record<ScheduleEntry["state"], number> = { overdue: 0, due_soon: 1, ok: 2 };

function dueTime(entry: ScheduleEntry): number {
  const time = Date.parse(entry.dueAt);
  return Number.isNaN(time) ? Number.POSITIVE_INFINITY : time;
}

/**
 * Overdue first (longest overdue at the top), then due soon, then the rest, each by due date;
 * spaces due at the same moment stay in name order so the list does not shuffle between visits.
 */
export function orderByDue(entries: readonly ScheduleEntry[]): ScheduleEntry[] {
  return [...entries].sort(
    (a, b) =>
      stateRank[a.state] - stateRank[b.state] ||
      dueTime(a) - dueTime(b) ||
      a.spaceName.localeCompare(b.spaceName, undefined, { numeric: true }),
  );
}

/** Only the spaces that want an audit now or soon, in the order to walk them. */
export function dueNow(entries: readonly ScheduleEntry[]): ScheduleEntry[] {
  return orderByDue(entries).filter((entry) => entry.state !== "ok");
}

const dayMs = 24 * 60 * 60 * 1000;

/** "Overdue by 3 days", "Due today", "Due in 5 days": whole days from `now`. */
export function describeDue(entry: ScheduleEntry, now: Date = new Date()): string {
  const due = dueTime(entry);
  if (!Number.isFinite(due)) return "Due date unknown";
  const days = Math.round((due - now.getTime()) / dayMs);
  if (entry.lastAuditAt === null && entry.state !== "ok") return "Not audited yet";
  if (entry.state === "overdue" || days < 0) {
    const late = Math.max(1, -days);
    return `Overdue by ${late} ${late === 1 ? "day" : "days"}`;
  }
  if (days === 0) return "Due today";
  return `Due in ${days} ${days === 1 ? "day" : "days"}`;
}
