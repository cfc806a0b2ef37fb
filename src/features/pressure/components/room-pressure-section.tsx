import type { PressureUnit } from "@shared/schemas/pressure-readings";
import type {
  PressureLive,
  PressureRange,
  PressureSpaceResponse,
} from "@shared/schemas/pressure-space";
import { lazy, Suspense, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { isApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";

import { useRoomPressure } from "../api/get-room-pressure";
import {
  formatAt,
  formatMinutes,
  formatPascalsIn,
  formatPressure,
  stateWords,
  unitWords,
} from "../lib/pressure-format";
import { MonitorForm } from "./monitor-form";
import { pressureChartStyle } from "./pressure-chart-style";

// The chart library loads only when a room with a monitor shows its chart.
const PressureChart = lazy(() => import("./pressure-chart"));

export interface RoomPressureSectionProps {
  spaceId: string;
  /** Whether the person may map a monitor here (administrators of the space's site). */
  canManage: (siteId: string) => boolean;
}

const stateStyles: Record<PressureLive["state"], string> = {
  in_range: "border-verdict-ready bg-verdict-ready/10 text-verdict-ready",
  out_of_range: "border-verdict-conditions bg-verdict-conditions/10 text-verdict-conditions",
  excursion: "border-verdict-not-ready bg-verdict-not-ready/10 text-verdict-not-ready",
  no_readings: "border-surface-line bg-surface-sunken text-ink",
  never_reported: "border-surface-line bg-surface-sunken text-ink",
};

function LiveValue({ data, unit }: { data: PressureSpaceResponse; unit: PressureUnit }) {
  const live = data.live!;
  const words = stateWords[live.state];
  const latest = live.latest;
  return (
    <div className="flex flex-col gap-3" data-testid="pressure-live">
      <div className="flex flex-wrap items-end gap-x-4 gap-y-1">
        <p className="text-4xl font-bold tracking-tight tabular-nums">
          {latest ? formatPressure(latest.pressure, latest.unit) : "No reading"}
        </p>
        {latest ? (
          <p className="pb-1 text-sm text-ink-muted">
            at {formatAt(latest.measuredAt, data.space.timeZone)}
            {latest.door ? ` · door ${latest.door}` : ""}
          </p>
        ) : null}
      </div>
      <div className={cn("rounded-lg border-l-4 px-3 py-2", stateStyles[live.state])} role="status">
        <p className="text-lg font-semibold">
          <span aria-hidden="true" className="mr-2 inline-block w-4 text-center">
            {words.mark}
          </span>
          {words.label}
        </p>
        <p className="text-sm text-ink">{words.meaning}</p>
      </div>
      <p className="text-sm text-ink-muted">
        Monitor <span className="font-mono break-all text-ink">{data.monitor!.monitorId}</span>. In
        range at {formatPressure(data.monitor!.thresholdInUnit, unit)} or more negative.{" "}
        {data.monitor!.thresholdWords}
      </p>
    </div>
  );
}

function RangeSwitch({
  range,
  onChange,
}: {
  range: PressureRange;
  onChange: (range: PressureRange) => void;
}) {
  const options: { value: PressureRange; label: string }[] = [
    { value: "24h", label: "24 hours" },
    { value: "30d", label: "30 days" },
  ];
  return (
    <div
      role="group"
      aria-label="Time range"
      className="inline-flex rounded-lg border border-surface-line bg-surface p-1"
    >
      {options.map((option) => (
        <button
          key={option.value}
          type="button"
          aria-pressed={range === option.value}
          onClick={() => onChange(option.value)}
          className={cn(
            "min-h-tap rounded-md px-4 font-semibold",
            range === option.value ? "bg-brand-700 text-white" : "text-brand-800 hover:bg-brand-50",
          )}
        >
          {option.label}
        </button>
      ))}
    </div>
  );
}

function Legend({ unit, threshold }: { unit: PressureUnit; threshold: number }) {
  const entries = [
    {
      label: "Mean reading",
      mark: (
        <path
          d="M1 8h14"
          stroke={pressureChartStyle.mean.colour}
          strokeWidth={pressureChartStyle.mean.width}
        />
      ),
    },
    {
      label: "Lowest to highest",
      mark: (
        <rect
          x="1"
          y="4"
          width="14"
          height="8"
          fill={pressureChartStyle.band.colour}
          fillOpacity={pressureChartStyle.band.opacity * 2}
        />
      ),
    },
    {
      label: `Threshold ${formatPressure(threshold, unit)}`,
      mark: (
        <path
          d="M1 8h14"
          stroke={pressureChartStyle.threshold.colour}
          strokeDasharray="4 3"
          strokeWidth={pressureChartStyle.threshold.width}
        />
      ),
    },
    {
      label: "Excursion (shaded)",
      mark: (
        <rect
          x="1"
          y="1"
          width="14"
          height="14"
          fill={pressureChartStyle.excursion.colour}
          fillOpacity={pressureChartStyle.excursion.opacity * 2}
          stroke={pressureChartStyle.excursion.colour}
        />
      ),
    },
  ];
  return (
    <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-muted">
      {entries.map((entry) => (
        <li key={entry.label} className="flex items-center gap-1.5">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 shrink-0">
            {entry.mark}
          </svg>
          {entry.label}
        </li>
      ))}
    </ul>
  );
}

const cell = "border-b border-surface-line px-2 py-1.5 align-top";
const number = `${cell} text-right tabular-nums`;
const head =
  "border-b-2 border-surface-line px-2 py-1.5 text-left align-bottom font-semibold text-ink-muted";

function PressureTable({ data, unit }: { data: PressureSpaceResponse; unit: PressureUnit }) {
  const hourly = data.range === "24h";
  const zone = data.space.timeZone;
  const rows = [...data.table].reverse();
  return (
    <div className="relative max-h-96 overflow-auto rounded-card border border-surface-line bg-surface">
      <table className="w-full border-collapse text-sm" data-testid="pressure-table">
        <caption className="px-2 pt-2 pb-1 text-left font-semibold">
          {hourly ? "Each hour" : "Each day"}, newest first, in {unitWords[unit]} (times at the
          site)
        </caption>
        <thead>
          <tr>
            <th scope="col" className={head}>
              {hourly ? "Hour" : "Day"}
            </th>
            <th scope="col" className={`${head} text-right`}>
              Mean
            </th>
            <th scope="col" className={`${head} text-right`}>
              Range
            </th>
            <th scope="col" className={`${head} text-right`}>
              In excursion
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.from}>
              <th scope="row" className={`${cell} text-left font-normal whitespace-nowrap`}>
                {hourly
                  ? `${formatAt(row.from, zone, "time")}–${formatAt(row.to, zone, "time")}`
                  : formatAt(row.from, zone, "day")}
              </th>
              {row.meanPa === null ? (
                <td className={`${cell} text-ink-muted`} colSpan={2}>
                  No readings
                </td>
              ) : (
                <>
                  <td className={number}>
                    {formatPascalsIn(row.meanPa, unit).replace(` ${unitWords[unit]}`, "")}
                  </td>
                  <td className={`${number} whitespace-nowrap`}>
                    {formatPascalsIn(row.minPa!, unit).replace(` ${unitWords[unit]}`, "")} to{" "}
                    {formatPascalsIn(row.maxPa!, unit).replace(` ${unitWords[unit]}`, "")}
                  </td>
                </>
              )}
              <td className={number}>
                {row.excursionMinutes > 0 ? formatMinutes(row.excursionMinutes) : "None"}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function AlarmLog({ data }: { data: PressureSpaceResponse }) {
  const zone = data.space.timeZone;
  const rangeWords = data.range === "24h" ? "the last 24 hours" : "the last 30 days";
  return (
    <div>
      <h3 className="text-lg font-semibold">Excursion log</h3>
      {data.alarms.length === 0 ? (
        <p className="mt-1 text-ink-muted">No excursions or silences in {rangeWords}.</p>
      ) : (
        <>
          {data.alarmCount > data.alarms.length ? (
            <p className="mt-1 text-sm text-ink-muted">
              The latest {data.alarms.length} of {data.alarmCount} in {rangeWords}.
            </p>
          ) : null}
          <ul className="mt-2 flex flex-col gap-2" data-testid="pressure-alarms">
            {data.alarms.map((alarm) => (
              <li
                key={alarm.id}
                className="rounded-lg border border-surface-line bg-surface px-3 py-2"
              >
                <p className="font-semibold">
                  {alarm.kind === "out_of_range" ? "Excursion" : "No readings"} from{" "}
                  {formatAt(alarm.startedAt, zone)}
                  {alarm.endedAt ? "" : " — still going on"}
                  {alarm.critical ? (
                    <span className="ml-2 inline-flex items-center rounded-full border border-verdict-not-ready px-2 text-sm text-verdict-not-ready">
                      <span aria-hidden="true" className="mr-1">
                        ◆
                      </span>
                      Critical
                    </span>
                  ) : null}
                </p>
                <p className="text-sm">
                  {alarm.endedAt ? "Lasted" : "So far"} {formatMinutes(alarm.durationMinutes)}
                  {alarm.worst
                    ? ` · worst ${formatPressure(alarm.worst.value, alarm.worst.unit)} at ${formatAt(alarm.worst.at, zone, "time")}`
                    : ""}
                </p>
                <p className="text-sm text-ink-muted">
                  {alarm.acknowledgement
                    ? `Acknowledged by ${alarm.acknowledgement.byName ?? "a former member"} at ${formatAt(alarm.acknowledgement.at, zone)}${alarm.acknowledgement.note ? `: “${alarm.acknowledgement.note}”` : ""}`
                    : "Not acknowledged"}
                </p>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

/**
 * The room's pressure on its space page: the live value and its state in words, the 24-hour or
 * 30-day chart with the same numbers in a table, the excursion log, and for the site's
 * administrators the monitor mapping. Shown for isolation rooms, and for any room with a monitor.
 */
export function RoomPressureSection({ spaceId, canManage }: RoomPressureSectionProps) {
  const [range, setRange] = useState<PressureRange>("24h");
  const query = useRoomPressure(spaceId, range);

  if (query.isPending)
    return (
      <Card aria-busy="true">
        <h2 className="text-lg font-semibold">Room pressure</h2>
        <Spinner label="Loading the room's pressure…" />
      </Card>
    );
  if (query.isError) {
    // Not this person's room or gone: the page around says so already.
    if (isApiError(query.error) && query.error.status === 404) return null;
    return (
      <Card>
        <h2 className="text-lg font-semibold">Room pressure</h2>
        <Alert tone="error" className="mt-2">
          {query.error.message}
        </Alert>
      </Card>
    );
  }
  const data = query.data;
  const manage = canManage(data.space.siteId) && !data.space.retired;
  if (!data.monitor && !data.space.takesMonitor) return null;

  if (!data.monitor || !data.live) {
    return (
      <Card aria-labelledby="room-pressure-heading" role="region">
        <h2 id="room-pressure-heading" className="text-lg font-semibold">
          Room pressure
        </h2>
        <p className="mt-1 text-ink-muted">No monitor is mapped to this room.</p>
        {manage ? <MonitorForm spaceId={spaceId} monitor={null} className="mt-4" /> : null}
      </Card>
    );
  }

  const unit = data.monitor.unit;
  return (
    <Card
      aria-labelledby="room-pressure-heading"
      role="region"
      className="flex min-w-0 flex-col gap-5"
    >
      <h2 id="room-pressure-heading" className="text-lg font-semibold">
        Room pressure
      </h2>
      {data.space.retired ? (
        <Alert tone="info">This room is retired: its monitor no longer raises alarms.</Alert>
      ) : null}
      <LiveValue data={data} unit={unit} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <RangeSwitch range={range} onChange={setRange} />
        {query.isFetching && query.isPlaceholderData ? (
          <Spinner label="Loading the range…" />
        ) : null}
      </div>
      <div className="grid min-w-0 gap-4 lg:grid-cols-[3fr_2fr] lg:items-start">
        <figure className="min-w-0 rounded-card border border-surface-line bg-surface p-2">
          {data.series.length === 0 ? (
            <p className="px-2 py-8 text-center text-ink-muted">
              No readings in {range === "24h" ? "the last 24 hours" : "the last 30 days"}.
            </p>
          ) : (
            <div
              role="img"
              aria-label={`Room pressure over ${range === "24h" ? "the last 24 hours, a point a minute" : "the last 30 days, a point an hour"}, with the threshold and ${data.alarms.filter((a) => a.kind === "out_of_range").length} excursions shaded. The table gives the same readings.`}
              style={{ height: 220 }}
              data-testid="pressure-chart"
            >
              <Suspense fallback={<Spinner label="Drawing the chart…" />}>
                <PressureChart data={data} unit={unit} height={220} />
              </Suspense>
            </div>
          )}
          <figcaption>
            <Legend unit={unit} threshold={data.monitor.thresholdInUnit} />
          </figcaption>
        </figure>
        <PressureTable data={data} unit={unit} />
      </div>
      <AlarmLog data={data} />
      {manage ? (
        <details className="rounded-lg border border-surface-line px-3 py-2">
          <summary className="min-h-tap cursor-pointer py-2 font-semibold text-brand-800">
            Change or unmap the monitor
          </summary>
          <MonitorForm spaceId={spaceId} monitor={data.monitor} className="mt-2" />
        </details>
      ) : null}
    </Card>
  );
}
