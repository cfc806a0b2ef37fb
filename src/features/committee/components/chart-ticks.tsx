import { Text } from "recharts";

import { chartColours } from "../lib/chart-style";

interface TickProps {
  x?: number | string;
  y?: number | string;
  payload?: { value: string };
}

/** A site name beside a vertical axis, wrapped onto two lines when it is long. */
export function SiteNameTickLeft(props: TickProps) {
  return (
    <Text
      x={Number(props.x)}
      y={Number(props.y)}
      width={140}
      textAnchor="end"
      verticalAnchor="middle"
      fill={chartColours.ink}
      fontSize={12}
    >
      {props.payload?.value ?? ""}
    </Text>
  );
}

/** A site name under a horizontal axis, wrapped to the width of its group of bars. */
export function SiteNameTickBelow(props: TickProps) {
  return (
    <Text
      x={Number(props.x)}
      y={Number(props.y) + 4}
      width={130}
      textAnchor="middle"
      verticalAnchor="start"
      fill={chartColours.ink}
      fontSize={12}
    >
      {props.payload?.value ?? ""}
    </Text>
  );
}
