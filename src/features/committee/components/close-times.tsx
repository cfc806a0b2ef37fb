import { severities } from "@shared/calc/verdict";
import type { TrendsResponse } from "@shared/schemas/committee";
import { Bar, BarChart, CartesianGrid, XAxis, YAxis } from "recharts";

import { Marker } from "@/components/ui/marker";
import { cn } from "@/lib/cn";

import { axisTick, chartColours, severityColours, tableStyles } from "../lib/chart-style";
import { severityLabels } from "../lib/committee-format";
import { ChartFigure, type LegendEntry } from "./chart-figure";
import { SiteNameTickBelow } from "./chart-ticks";

type CloseTimes = TrendsResponse["closeTimes"];

const legend: LegendEntry[] = severities.map((severity) => ({
  label: severityLabels[severity],
  // The severity's own shape in its colour: the bars of that colour are that severity.
  mark: <Marker name={severity} cx={8} cy={8} r={6} strokeWidth={1.8} />,
}));

const daysText = (days: number) => `${days.toLocaleString()} ${days === 1 ? "day" : "days"}`;

function CloseTimesTable({ closeTimes }: { closeTimes: CloseTimes }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Median days to close</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Site
            </th>
            <th scope="col" className={tableStyles.head}>
              Severity
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Closed
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Median to close
            </th>
          </tr>
        </thead>
        <tbody>
          {closeTimes.map((row) => (
            <tr key={`${row.siteId}-${row.severity}`}>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                {row.siteName}
              </th>
              <td className={tableStyles.cell}>{severityLabels[row.severity]}</td>
              <td className={tableStyles.number}>{row.closed}</td>
              <td className={cn(tableStyles.number, "font-semibold")}>
                {daysText(row.medianDays)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** How long the fixes confirmed in the period took, per site and severity. */
export function CloseTimes({ closeTimes }: { closeTimes: CloseTimes }) {
  if (closeTimes.length === 0) {
    return <p className="text-ink-muted">No fixes were confirmed in this period.</p>;
  }
  const sites = [...new Map(closeTimes.map((row) => [row.siteId, row.siteName])).entries()];
  const rows = sites.map(([siteId, name]) => ({
    name,
    ...Object.fromEntries(
      closeTimes
        .filter((row) => row.siteId === siteId)
        .map((row) => [row.severity, row.medianDays]),
    ),
  }));
  const summary = `Bars of median days to close by site and severity: ${closeTimes
    .map((row) => `${row.siteName}, ${severityLabels[row.severity]}: ${daysText(row.medianDays)}`)
    .join("; ")}. The same numbers are in the table.`;

  return (
    <ChartFigure
      summary={summary}
      height={280}
      legend={legend}
      sideBySide
      table={<CloseTimesTable closeTimes={closeTimes} />}
      chart={
        <BarChart
          data={rows}
          accessibilityLayer={false}
          margin={{ top: 8, right: 8, bottom: 4, left: 0 }}
        >
          <CartesianGrid stroke={chartColours.grid} vertical={false} />
          <XAxis dataKey="name" tick={<SiteNameTickBelow />} interval={0} height={44} />
          <YAxis
            tick={axisTick}
            width={44}
            allowDecimals={false}
            label={{
              value: "days",
              angle: -90,
              position: "insideLeft",
              fill: chartColours.inkMuted,
            }}
          />
          {severities.map((severity) => (
            <Bar
              key={severity}
              dataKey={severity}
              name={severityLabels[severity]}
              fill={severityColours[severity]}
              maxBarSize={48}
              isAnimationActive={false}
            />
          ))}
        </BarChart>
      }
    />
  );
}
