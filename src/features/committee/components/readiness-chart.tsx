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

/** A filled circle for a ranked site, a hollow diamond for a small sample: shape, not colour alone. */
function SiteMark(props: unknown) {
  const { cx, cy, payload } = props as { cx?: number; cy?: number; payload?: Point };
  if (cx === undefined || cy === undefined) return <g />;
  return payload?.small ? (
    <path
      d={`M${cx} ${cy - 8} L${cx + 8} ${cy} L${cx} ${cy + 8} L${cx - 8} ${cy} Z`}
      fill="white"
      stroke={chartColours.clay}
      strokeWidth={2.5}
    />
  ) : (
    <circle cx={cx} cy={cy} r={7} fill={chartColours.brand} />
  );
}

const legend: LegendEntry[] = [
  {
    label: "Readiness, ranked",
    mark: <circle cx="8" cy="8" r="5" fill={chartColours.brand} />,
  },
  {
    label: "Small sample, not ranked",
    mark: (
      <path
        d="M8 2.5 13.5 8 8 13.5 2.5 8Z"
        fill="white"
        stroke={chartColours.clay}
        strokeWidth="2"
      />
    ),
  },
  {
    label: "95% interval",
    mark: (
      <path d="M2 8h12M2 5v6M14 5v6" stroke={chartColours.inkMuted} strokeWidth="1.5" fill="none" />
    ),
  },
  {
    label: "All sites together",
    mark: (
      <path d="M8 1v14" stroke={chartColours.inkMuted} strokeWidth="1.5" strokeDasharray="3 2" />
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
              stroke={chartColours.inkMuted}
              strokeDasharray="4 3"
              ifOverflow="extendDomain"
            />
          ) : null}
          <Scatter name="Readiness" data={points} shape={SiteMark} isAnimationActive={false}>
            <ErrorBar
              dataKey="whisker"
              direction="x"
              width={10}
              stroke={chartColours.inkMuted}
              strokeWidth={2}
              isAnimationActive={false}
            />
          </Scatter>
        </ScatterChart>
      }
    />
  );
}
