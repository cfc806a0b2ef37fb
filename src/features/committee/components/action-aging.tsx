import { ageBuckets, type TrendsResponse } from "@shared/schemas/committee";
import { Bar, BarChart, CartesianGrid, XAxis, YAxis } from "recharts";

import { markerPath, markers } from "@/components/ui/markers";
import { cn } from "@/lib/cn";

import { ageBucketColours, axisTick, chartColours, tableStyles } from "../lib/chart-style";
import { ageBucketLabels } from "../lib/committee-format";
import { ChartFigure, type LegendEntry } from "./chart-figure";
import { SiteNameTickLeft } from "./chart-ticks";

type Aging = TrendsResponse["aging"];
type Measure = "unfinished" | "overdue";

const titles: Record<Measure, string> = {
  unfinished: "Actions not done yet, by days since raised",
  overdue: "Overdue actions by days past due",
};

const legend: LegendEntry[] = ageBuckets.map((bucket) => ({
  label: ageBucketLabels[bucket],
  // A bar swatch (the vocabulary's "bar" shape) in the bucket's colour.
  mark: (
    <path
      data-marker="barColour"
      d={markerPath(markers.barColour.shape, 8, 8, 7)}
      fill={ageBucketColours[bucket]}
    />
  ),
}));

const totalOf = (buckets: Aging[number]["unfinished"]) =>
  ageBuckets.reduce((sum, bucket) => sum + buckets[bucket], 0);

function AgingTable({ aging, measure }: { aging: Aging; measure: Measure }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>{titles[measure]}</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Site
            </th>
            {ageBuckets.map((bucket) => (
              <th key={bucket} scope="col" className={cn(tableStyles.head, "text-right")}>
                {ageBucketLabels[bucket]}
              </th>
            ))}
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Total
            </th>
          </tr>
        </thead>
        <tbody>
          {aging.map((site) => (
            <tr key={site.siteId}>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                {site.siteName}
              </th>
              {ageBuckets.map((bucket) => (
                <td key={bucket} className={tableStyles.number}>
                  {site[measure][bucket]}
                </td>
              ))}
              <td className={cn(tableStyles.number, "font-semibold")}>{totalOf(site[measure])}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function AgingChart({ aging, measure }: { aging: Aging; measure: Measure }) {
  const rows = aging.map((site) => ({ name: site.siteName, ...site[measure] }));
  const summary = `Stacked bars of ${titles[measure].toLowerCase()}: ${aging
    .map((site) => `${site.siteName} ${totalOf(site[measure])}`)
    .join("; ")}. The same numbers are in the table.`;
  return (
    <section aria-label={titles[measure]} className="flex flex-col gap-2">
      <h3 className="text-lg font-semibold">{titles[measure]}</h3>
      <ChartFigure
        summary={summary}
        height={60 + Math.max(aging.length, 1) * 48}
        legend={legend}
        sideBySide
        table={<AgingTable aging={aging} measure={measure} />}
        chart={
          <BarChart
            data={rows}
            layout="vertical"
            accessibilityLayer={false}
            margin={{ top: 4, right: 16, bottom: 4, left: 4 }}
          >
            <CartesianGrid stroke={chartColours.grid} horizontal={false} />
            <XAxis type="number" allowDecimals={false} tick={axisTick} />
            <YAxis type="category" dataKey="name" width={150} tick={<SiteNameTickLeft />} />
            {ageBuckets.map((bucket) => (
              <Bar
                key={bucket}
                dataKey={bucket}
                name={ageBucketLabels[bucket]}
                stackId="age"
                fill={ageBucketColours[bucket]}
                maxBarSize={32}
                stroke="white"
                isAnimationActive={false}
              />
            ))}
          </BarChart>
        }
      />
    </section>
  );
}

/** Unclosed and overdue actions at each site today, by how long they have waited. */
export function ActionAging({ aging }: { aging: Aging }) {
  return (
    <div className="flex flex-col gap-6">
      <AgingChart aging={aging} measure="unfinished" />
      <AgingChart aging={aging} measure="overdue" />
    </div>
  );
}
