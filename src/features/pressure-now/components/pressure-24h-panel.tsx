import type { Pressure24hResponse } from "@shared/schemas/pressure-site";

import { chartPalette } from "@/components/ui/palette";

import { usePressure24h } from "../api/get-pressure-24h";
import { formatDuration, formatPressure } from "../lib/pressure-words";

const width = 300;
const height = 56;

/** A small line of the minute means, with the threshold dashed across it. */
function Sparkline({ day }: { day: Pressure24hResponse }) {
  const from = Date.parse(day.from);
  const span = Math.max(1, Date.parse(day.to) - from);
  const values = day.points.flatMap((point) => [point.minPa, point.maxPa]);
  const low = Math.min(...values, day.thresholdPa) - 0.5;
  const high = Math.max(...values, day.thresholdPa) + 0.5;
  const x = (at: string) => ((Date.parse(at) - from) / span) * width;
  const y = (pa: number) => height - ((pa - low) / (high - low)) * height;
  const line = day.points
    .map(
      (point, index) =>
        `${index === 0 ? "M" : "L"}${x(point.at).toFixed(1)},${y(point.meanPa).toFixed(1)}`,
    )
    .join(" ");
  return (
    <svg
      viewBox={`0 0 ${width} ${height}`}
      preserveAspectRatio="none"
      className="h-14 w-full rounded border border-surface-line bg-surface"
      aria-hidden="true"
    >
      <line
        x1={0}
        x2={width}
        y1={y(day.thresholdPa)}
        y2={y(day.thresholdPa)}
        stroke={chartPalette.flagged}
        strokeWidth={1.5}
        strokeDasharray="5 3"
        vectorEffect="non-scaling-stroke"
      />
      <path
        d={line}
        fill="none"
        stroke={chartPalette.value}
        strokeWidth={1.5}
        vectorEffect="non-scaling-stroke"
      />
    </svg>
  );
}

/** The words that carry the same as the line: lowest, mean, highest, time out of range. */
export function describeDay(day: Pressure24hResponse): string {
  const summary = day.summary!;
  const out =
    summary.minutesOutOfRange === 0
      ? "no minute out of range"
      : `${formatDuration(summary.minutesOutOfRange * 60_000)} with a reading out of range`;
  return `Last 24 hours: lowest ${formatPressure(summary.minPa, "Pa")}, mean ${formatPressure(summary.meanPa, "Pa")}, highest ${formatPressure(summary.maxPa, "Pa")}; ${out} (threshold ${formatPressure(day.thresholdPa, "Pa")}, ${formatDuration(summary.minutes * 60_000)} monitored).`;
}

/**
 * Beside an isolation room's pressure item: what the room's monitor recorded over the last 24
 * hours, so the auditor judges the item with the history in view. Never holds the audit up: offline
 * or unreachable, it says so in words and the item is answered as usual.
 */
export function Pressure24hPanel({ spaceId }: { spaceId: string }) {
  const day = usePressure24h(spaceId);
  let body;
  if (day.data === undefined && day.fetchStatus === "paused") {
    body = (
      <p>
        Offline: the monitor's last 24 hours cannot be shown now. Answer from the monitor's own
        display or a smoke test.
      </p>
    );
  } else if (day.isPending) {
    body = <p>Loading the monitor's last 24 hours…</p>;
  } else if (day.data === undefined) {
    body = (
      <p>
        The monitor's last 24 hours could not be loaded ({day.error?.message}). Answer the item as
        usual.
      </p>
    );
  } else if (day.data.monitorId === null) {
    body = <p>No pressure monitor is mapped to this room.</p>;
  } else if (day.data.summary === null) {
    body = <p>The room's monitor sent no readings in the last 24 hours.</p>;
  } else {
    body = (
      <>
        <Sparkline day={day.data} />
        <p className="flex justify-between text-xs" aria-hidden="true">
          <span>24 hours ago</span>
          <span>now</span>
        </p>
        <p className="mt-1">{describeDay(day.data)}</p>
        <p className="mt-1 text-xs">
          Solid line: the mean of each minute. Dashed line: the room's threshold.
        </p>
      </>
    );
  }
  return (
    <section
      aria-label="Room pressure, last 24 hours"
      className="rounded-lg border border-surface-line bg-surface-sunken p-3 text-sm text-ink-muted"
    >
      <h3 className="mb-1 font-semibold text-ink">From the room's monitor</h3>
      {body}
    </section>
  );
}
