import type { PressureUnit } from "@shared/schemas/pressure-readings";
import type { PressureSpaceResponse } from "@shared/schemas/pressure-space";
import {
  Area,
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  XAxis,
  YAxis,
} from "recharts";

import { chartPalette } from "@/components/ui/palette";

import { formatAt, inUnit, unitWords } from "../lib/pressure-format";
import { pressureChartStyle } from "./pressure-chart-style";

export interface PressureChartProps {
  data: PressureSpaceResponse;
  unit: PressureUnit;
  height: number;
}

interface Point {
  t: number;
  mean: number | null;
  band: [number, number] | null;
}

/**
 * The range's means with the lowest-to-highest band, the threshold as a dashed line and each
 * excursion shaded. A gap in the readings is a gap in the line, not a line drawn across it.
 * Loaded only with the room pressure section (its own chunk).
 */
export default function PressureChart({ data, unit, height }: PressureChartProps) {
  const step = data.bucket === "minute" ? 60_000 : 3_600_000;
  // A gap the monitor's silence alarm would call "no readings" (10 minutes) breaks the line; in
  // hourly buckets, a whole hour without a reading.
  const breakAfter = data.bucket === "minute" ? 10 * 60_000 : 1.5 * 3_600_000;
  const points: Point[] = [];
  let previous: number | null = null;
  for (const point of data.series) {
    const t = new Date(point.at).getTime();
    if (previous !== null && t - previous >= breakAfter)
      points.push({ t: previous + step, mean: null, band: null });
    points.push({
      t,
      mean: inUnit(point.meanPa, unit),
      band: [inUnit(point.minPa, unit), inUnit(point.maxPa, unit)],
    });
    previous = t;
  }
  const from = new Date(data.from).getTime();
  const to = new Date(data.to).getTime();
  const threshold = inUnit(data.monitor?.thresholdPa ?? -2.5, unit);
  const values = points.flatMap((p) => (p.band ? p.band : []));
  const low = Math.min(threshold, ...values);
  const high = Math.max(threshold, 0, ...values);
  // Whole Pa (or hundredths of an inch of water) at the ends, so the ticks read as round numbers.
  const grain = unit === "Pa" ? 1 : 0.01;
  const spanUnits = (high - low) / grain;
  const stepUnits = [1, 2, 5, 10, 20, 50].find((candidate) => spanUnits / candidate <= 5) ?? 100;
  const yStep = stepUnits * grain;
  const bottom = Math.floor(low / yStep - 0.2) * yStep;
  const top = Math.ceil(high / yStep + 0.2) * yStep;
  const yTicks: number[] = [];
  for (let v = bottom; v <= top + yStep / 2; v += yStep) yTicks.push(Number(v.toFixed(4)));
  // Ticks on round hours (every 6) or days (every 7), counted back from the end.
  const tickStep = data.range === "24h" ? 6 * 3_600_000 : 7 * 86_400_000;
  const ticks: number[] = [];
  for (let t = Math.floor(to / tickStep) * tickStep; t >= from; t -= tickStep) ticks.unshift(t);
  const excursions = data.alarms.filter((alarm) => alarm.kind === "out_of_range");
  const timeZone = data.space.timeZone;
  const digits = unit === "Pa" ? 0 : 2;

  return (
    <ResponsiveContainer width="100%" height={height} initialDimension={{ width: 340, height }}>
      <ComposedChart data={points} margin={{ top: 8, right: 8, bottom: 4, left: 4 }}>
        <CartesianGrid stroke={chartPalette.grid} vertical={false} />
        <XAxis
          dataKey="t"
          type="number"
          scale="time"
          domain={[from, to]}
          ticks={ticks}
          tickFormatter={(t: number) =>
            formatAt(new Date(t).toISOString(), timeZone, data.range === "24h" ? "time" : "day")
          }
          tick={{ fill: chartPalette.reference, fontSize: 12 }}
          allowDataOverflow
        />
        <YAxis
          domain={[bottom, top]}
          ticks={yTicks}
          tickFormatter={(v: number) => v.toFixed(digits).replace("-", "−")}
          tick={{ fill: chartPalette.reference, fontSize: 12 }}
          width={unit === "Pa" ? 40 : 52}
          label={{
            value: unitWords[unit],
            angle: -90,
            position: "insideLeft",
            fill: chartPalette.reference,
            fontSize: 12,
          }}
          allowDataOverflow
        />
        {excursions.map((alarm) => (
          <ReferenceArea
            key={alarm.id}
            x1={Math.max(from, new Date(alarm.startedAt).getTime())}
            x2={Math.min(to, alarm.endedAt ? new Date(alarm.endedAt).getTime() : to)}
            fill={pressureChartStyle.excursion.colour}
            fillOpacity={pressureChartStyle.excursion.opacity}
            stroke={pressureChartStyle.excursion.colour}
            strokeOpacity={0.5}
            ifOverflow="hidden"
          />
        ))}
        <Area
          dataKey="band"
          stroke="none"
          fill={pressureChartStyle.band.colour}
          fillOpacity={pressureChartStyle.band.opacity}
          isAnimationActive={false}
          connectNulls={false}
        />
        <Line
          dataKey="mean"
          stroke={pressureChartStyle.mean.colour}
          strokeWidth={pressureChartStyle.mean.width}
          dot={false}
          isAnimationActive={false}
          connectNulls={false}
        />
        <ReferenceLine
          y={threshold}
          stroke={pressureChartStyle.threshold.colour}
          strokeDasharray={pressureChartStyle.threshold.dash}
          strokeWidth={pressureChartStyle.threshold.width}
          ifOverflow="extendDomain"
        />
      </ComposedChart>
    </ResponsiveContainer>
  );
}
