import { type MarkerName, markerPaint, markerPath, markers } from "./markers";

const reactNames: Record<string, string> = {
  "fill-opacity": "fillOpacity",
  "stroke-width": "strokeWidth",
  "stroke-linejoin": "strokeLinejoin",
};

export interface MarkerProps {
  name: MarkerName;
  cx: number;
  cy: number;
  /** Reach from the centre, in the drawing's units. */
  r: number;
  strokeWidth?: number;
}

/** One marker from the vocabulary, drawn inside an SVG (charts and their legends). */
export function Marker({ name, cx, cy, r, strokeWidth = 2 }: MarkerProps) {
  const marker = markers[name];
  const paint = Object.fromEntries(
    Object.entries(markerPaint(marker, strokeWidth)).map(([key, value]) => [
      reactNames[key] ?? key,
      value,
    ]),
  );
  return <path data-marker={name} d={markerPath(marker.shape, cx, cy, r)} {...paint} />;
}
