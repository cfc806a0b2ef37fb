import type { TrendsResponse } from "@shared/schemas/committee";
import { CartesianGrid, ComposedChart, Line, ReferenceLine, XAxis, YAxis } from "recharts";

import { Marker } from "@/components/ui/marker";
import { chartLines, markers } from "@/components/ui/markers";
import { cn } from "@/lib/cn";

import { axisTick, chartColours, tableStyles } from "../lib/chart-style";
import { monthText, percentText } from "../lib/committee-format";
import { ChartFigure, type LegendEntry } from "./chart-figure";

type SiteTrend = TrendsResponse["sites"][number];
type TrendPoint = SiteTrend["points"][number];

interface ChartRow {
  month: string;
  p: number;
  upper: number;
  lower: number;
  outside: boolean;
}

/** Which side of the limits a point fell on, in words. */
export function outsideText(point: TrendPoint): string {
  return point.p > point.upper ? "above the upper limit" : "below the lower limit";
}

/** A triangle for a month outside the limits, a small solid circle for the others. */
function MonthMark(props: unknown) {
  const { cx, cy, payload } = props as { cx?: number; cy?: number; payload?: ChartRow };
  if (cx === undefined || cy === undefined) return <g />;
  return payload?.outside ? (
    <Marker name="outsideLimits" cx={cx} cy={cy} r={8} strokeWidth={3} />
  ) : (
    <Marker name="readiness" cx={cx} cy={cy} r={4.5} />
  );
}

const legend = (centre: number): LegendEntry[] => [
  {
    label: "Readiness of a month",
    mark: <Marker name="readiness" cx={8} cy={8} r={4.5} />,
  },
  {
    label: markers.outsideLimits.words,
    mark: <Marker name="outsideLimits" cx={8} cy={8.5} r={6.5} />,
  },
  {
    label: `${chartLines.centre.words} (${percentText(centre)})`,
    mark: <path d="M1 8h14" stroke={chartLines.centre.colour} strokeWidth="2" />,
  },
  {
    label: `${chartLines.limits.words} (3 sigma, for each month's audits)`,
    mark: (
      <path
        d="M1 8h14"
        stroke={chartLines.limits.colour}
        strokeWidth="1.5"
        strokeDasharray={chartLines.limits.dash}
      />
    ),
  },
];

function PointsTable({ site }: { site: SiteTrend }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>{`Monthly readiness at ${site.siteName}`}</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Month
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Audits
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Ready
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Readiness
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Lower limit
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Upper limit
            </th>
            <th scope="col" className={tableStyles.head}>
              Within the limits?
            </th>
          </tr>
        </thead>
        <tbody>
          {site.points.map((point) => (
            <tr key={point.month} className={cn(point.outside && "bg-clay-50 font-semibold")}>
              <th scope="row" className={cn(tableStyles.cell, "whitespace-nowrap")}>
                {monthText(point.month)}
              </th>
              <td className={tableStyles.number}>{point.audits}</td>
              <td className={tableStyles.number}>{point.allClear}</td>
              <td className={tableStyles.number}>{percentText(point.p)}</td>
              <td className={tableStyles.number}>{percentText(point.lower)}</td>
              <td className={tableStyles.number}>{percentText(point.upper)}</td>
              <td className={tableStyles.cell}>
                {point.outside ? `Outside: ${outsideText(point)}` : "Within"}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export interface PChartProps {
  site: SiteTrend;
}

/**
 * One site's monthly readiness on a p-chart. The limits step with each month's number of audits,
 * so a month with few audits gets wider limits; months outside them are named in words.
 */
export function PChart({ site }: PChartProps) {
  const headingId = `p-chart-${site.siteId}`;
  const outside = site.points.filter((point) => point.outside);
  const centre = site.centre;
  const rows: ChartRow[] = site.points.map((point) => ({
    month: monthText(point.month),
    p: point.p * 100,
    upper: point.upper * 100,
    lower: point.lower * 100,
    outside: point.outside,
  }));

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3 break-inside-avoid-page">
      <h3 id={headingId} className="text-lg font-semibold">
        {site.siteName}
      </h3>
      {centre === null || site.points.length === 0 ? (
        <p className="text-ink-muted">No audits in this period.</p>
      ) : (
        <>
          <ChartFigure
            summary={`Control chart of monthly readiness at ${site.siteName}, ${site.points.length} months, centre line ${percentText(centre)}; ${outside.length === 0 ? "no month outside the limits" : `${outside.length} ${outside.length === 1 ? "month" : "months"} outside the limits`}. The same numbers are in the table.`}
            height={260}
            legend={legend(centre)}
            table={<PointsTable site={site} />}
            sideBySide
            chart={
              <ComposedChart
                data={rows}
                accessibilityLayer={false}
                margin={{ top: 10, right: 16, bottom: 4, left: 0 }}
              >
                <CartesianGrid stroke={chartColours.grid} vertical={false} />
                <XAxis
                  dataKey="month"
                  tick={axisTick}
                  interval="preserveStartEnd"
                  minTickGap={8}
                  padding={{ left: 28, right: 28 }}
                />
                <YAxis
                  domain={[0, 100]}
                  ticks={[0, 25, 50, 75, 100]}
                  unit="%"
                  tick={axisTick}
                  width={48}
                />
                <ReferenceLine
                  y={centre * 100}
                  stroke={chartLines.centre.colour}
                  strokeWidth={chartLines.centre.width}
                />
                {/* The 3-sigma limits, stepping with each month's number of audits. */}
                {(["upper", "lower"] as const).map((limit) => (
                  <Line
                    key={limit}
                    dataKey={limit}
                    type="step"
                    stroke={chartLines.limits.colour}
                    strokeDasharray={chartLines.limits.dash}
                    strokeWidth={chartLines.limits.width}
                    dot={false}
                    activeDot={false}
                    isAnimationActive={false}
                  />
                ))}
                <Line
                  dataKey="p"
                  type="linear"
                  stroke={chartColours.brand}
                  strokeWidth={2}
                  dot={MonthMark}
                  activeDot={false}
                  isAnimationActive={false}
                />
              </ComposedChart>
            }
          />
          {outside.length === 0 ? (
            <p className="text-sm text-ink-muted">
              No month falls outside the limits: the variation looks like ordinary month-to-month
              noise.
            </p>
          ) : (
            <div className="text-sm">
              <p className="font-semibold">
                {`Outside the limits at ${site.siteName}, worth a closer look:`}
              </p>
              <ul
                aria-label={`Months outside the limits at ${site.siteName}`}
                className="mt-1 list-disc pl-5"
              >
                {outside.map((point) => (
                  <li key={point.month}>
                    {`${monthText(point.month, "long")}: ${percentText(point.p)} all clear (${point.allClear} of ${point.audits} audits), ${outsideText(point)} of ${percentText(point.p > point.upper ? point.upper : point.lower)}.`}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </>
      )}
    </section>
  );
}
