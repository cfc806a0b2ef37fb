import { type AgeBucket } from "@shared/schemas/committee";

const minus = "\u2212";

/** A share as a percentage with one decimal: 0.6214 → "62.1%". */
export function percentText(value: number | null | undefined): string {
  if (value === null || value === undefined) return "—";
  return `${(value * 100).toFixed(1)}%`;
}

/** An interval as the committee reads it: "62.1% – 78.4%". */
export function intervalText(interval: { lower: number; upper: number } | null): string {
  if (!interval) return "—";
  return `${percentText(interval.lower)} – ${percentText(interval.upper)}`;
}

/** A difference of two shares in percentage points, signed: "+8.3" or "−1.2". */
export function pointsText(value: number): string {
  const points = value * 100;
  const rounded = Math.abs(points).toFixed(1);
  if (rounded === "0.0") return "0.0";
  return `${points > 0 ? "+" : minus}${rounded}`;
}

/** "2026-03" → "Mar 2026", whatever the reader's time zone. */
export function monthText(month: string, style: "short" | "long" = "short"): string {
  const [year, monthNumber] = month.split("-").map(Number) as [number, number];
  if (!year || !monthNumber) return month;
  return new Intl.DateTimeFormat(undefined, {
    month: style,
    year: "numeric",
    timeZone: "UTC",
  }).format(new Date(Date.UTC(year, monthNumber - 1, 1)));
}

export function periodText(from: string, to: string): string {
  return from === to
    ? monthText(from, "long")
    : `${monthText(from, "long")} to ${monthText(to, "long")}`;
}

export function countText(count: number, one: string, many: string): string {
  return `${count.toLocaleString()} ${count === 1 ? one : many}`;
}

export function bytesText(bytes: number): string {
  if (bytes < 1000) return countText(bytes, "byte", "bytes");
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(bytes < 10_000 ? 1 : 0)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** Severities in words, the same everywhere. */
export { severityLabels } from "@shared/calc/verdict";

export const ageBucketLabels: Record<AgeBucket, string> = {
  "0-7": "0–7 days",
  "8-30": "8–30 days",
  "31-90": "31–90 days",
  "90+": "Over 90 days",
};
