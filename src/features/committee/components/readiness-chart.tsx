import type { ReactNode } from "react";
import type { ComparisonResponse } from "@shared/schemas/committee";
import {
  CartesianGrid,
  ErrorBar,
  ReferenceLine,
  Scatter,
  ScatterChart,
  XAxis,
  YAxis,
} from "recharts";

import { Marker } from "@/components/ui/marker";
import { chartLines, markers } from "@/components/ui/markers";

import { axisTick, chartColours } from "../lib/chart-style";
import { intervalText, percentText } from "../lib/committee-format";
import { ChartFigure, type LegendEntry } from "./chart-figure";
import { SiteNameTickLeft } from "./chart-ticks";

interface Point {
  name: string;
  rate: number;
  /** Distances from the rate down to the lower bound and up to the upper, in percent. */
  whisker: [number, number];
  small: boolean;
}

/** A solid circle for a ranked site, a ring for a small sample: shape, not colour alone. */
function SiteMark(props: unknown) {
  const { cx, cy, payload } = props as { cx?: number; cy?: number; payload?: Point };
  if (cx === undefined || cy === undefined) return <g />;
  return payload?.small ? (
    <Marker name="smallSample" cx={cx} cy={cy} r={7} strokeWidth={2.5} />
  ) : (
    <Marker name="readiness" cx={cx} cy={cy} r={7} />
  );
}

const legend: LegendEntry[] = [
  {
    label: "Readiness of a site, ranked",
    mark: <Marker name="readiness" cx={8} cy={8} r={5} />,
  },
  {
    label: markers.smallSample.words,
    mark: <Marker name="smallSample" cx={8} cy={8} r={5} />,
  },
  {
    label: chartLines.interval.words,
    mark: (
      <path
        d="M2 8h12M2 5v6M14 5v6"
        stroke={chartLines.interval.colour}
        strokeWidth="1.5"
        fill="none"
      />
    ),
  },
  {
    label: chartLines.allSites.words,
    mark: (
      <path
        d="M8 1v14"
        stroke={chartLines.allSites.colour}
        strokeWidth="2"
        strokeDasharray={chartLines.allSites.dash}
        strokeLinecap="round"
      />
    ),
  },
];

export interface ReadinessChartProps {
  comparison: ComparisonResponse;
  table: ReactNode;
}

/** Each site's readiness as a dot with its 95% interval as whiskers, beside the site table. */
export function ReadinessChart({ comparison, table }: ReadinessChartProps) {
  const measured = comparison.sites.filter((site) => site.readiness.rate !== null);
  const toPoint = (site: (typeof measured)[number]): Point => {
    const rate = site.readiness.rate! * 100;
    const interval = site.readiness.interval ?? {
      lower: site.readiness.rate!,
      upper: site.readiness.rate!,
    };
    return {
      name: site.siteName,
      rate,
      whisker: [rate - interval.lower * 100, interval.upper * 100 - rate],
      small: site.readiness.smallSample,
    };
  };
  const points = measured.map(toPoint);
  const summary = `Chart of readiness by site with 95% intervals: ${measured
    .map(
      (site) =>
        `${site.siteName} ${percentText(site.readiness.rate)} (${intervalText(site.readiness.interval)})`,
    )
    .join("; ")}. The same numbers are in the table.`;
  const height = 60 + Math.max(measured.length, 1) * 56;

  return (
    <ChartFigure
      summary={summary}
      height={height}
      legend={legend}
      table={table}
      chart={
        <ScatterChart accessibilityLayer={false} margin={{ top: 8, right: 24, bottom: 8, left: 8 }}>
          <CartesianGrid stroke={chartColours.grid} horizontal={false} />
          <XAxis
            type="number"
            dataKey="rate"
            domain={[0, 100]}
            ticks={[0, 25, 50, 75, 100]}
            unit="%"
            tick={axisTick}
            name="Readiness"
          />
          <YAxis
            type="category"
            dataKey="name"
            width={160}
            allowDuplicatedCategory={false}
            reversed
            tick={<SiteNameTickLeft />}
            name="Site"
          />
          {comparison.network.rate !== null ? (
            <ReferenceLine
              x={comparison.network.rate * 100}
              stroke={chartLines.allSites.colour}
              strokeWidth={chartLines.allSites.width}
              strokeDasharray={chartLines.allSites.dash}
              strokeLinecap="round"
              ifOverflow="extendDomain"
            />
          ) : null}
          <Scatter name="Readiness" data={points} shape={SiteMark} isAnimationActive={false}>
            <ErrorBar
              dataKey="whisker"
              direction="x"
              width={10}
              stroke={chartLines.interval.colour}
              strokeWidth={chartLines.interval.width}
              isAnimationActive={false}
            />
          </Scatter>
        </ScatterChart>
      }
    />
  );
}
