import { isKnownTimeZone } from "@shared/schemas/common";

/** The current wall-clock time at a site, e.g. "14:05"; null when the zone is not recognised. */
export function formatLocalTime(timeZone: string, at: Date = new Date()): string | null {
  if (!isKnownTimeZone(timeZone)) return null;
  return new Intl.DateTimeFormat(undefined, { timeZone, timeStyle: "short" }).format(at);
}

/** A readable form of an IANA zone name: "America/New_York" → "America/New York". */
export function formatTimeZone(timeZone: string): string {
  return timeZone.replaceAll("_", " ");
}

export function formatCoordinate(value: number, positive: string, negative: string): string {
  return `${Math.abs(value).toFixed(4)}° ${value >= 0 ? positive : negative}`;
}

/** A moment in the reader's own time zone, e.g. "3 Dec 2026, 14:05". */
export function formatDateTime(iso: string): string {
  const at = new Date(iso);
  if (Number.isNaN(at.getTime())) return iso;
  return new Intl.DateTimeFormat(undefined, { dateStyle: "medium", timeStyle: "short" }).format(at);
}
