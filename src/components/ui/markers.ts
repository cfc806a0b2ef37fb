import { chartPalette, overdueColour, severityPalette } from "./palette";

/**
 * Lintel's one vocabulary of chart and map markers. Each shape has exactly one meaning wherever it
 * is drawn: a solid circle is always a measured readiness, a triangle always a month outside its
 * control limits, a diamond always a critical action, and so on. Charts, map pins and their keys
 * draw from here and label every marker in words.
 */
export const markerShapes = [
  "circle",
  "ring",
  "triangle",
  "diamond",
  "square",
  "hexagon",
  "clock",
  "bar",
] as const;
export type MarkerShape = (typeof markerShapes)[number];

/** How a shape is painted: filled, outlined on white, or outlined over a light fill. */
export type MarkerStyle = "solid" | "hollow" | "tinted";

export interface Marker {
  shape: MarkerShape;
  style: MarkerStyle;
  colour: string;
  /** What the marker means, as a key or legend says it. */
  words: string;
}

export const markers = {
  readiness: {
    shape: "circle",
    style: "solid",
    colour: chartPalette.value,
    words: "Readiness",
  },
  smallSample: {
    shape: "ring",
    style: "hollow",
    colour: chartPalette.flagged,
    words: "Small sample, not ranked",
  },
  outsideLimits: {
    shape: "triangle",
    style: "solid",
    colour: chartPalette.flagged,
    words: "Outside the control limits",
  },
  critical: {
    shape: "diamond",
    style: "solid",
    colour: severityPalette.critical,
    words: "Critical",
  },
  major: { shape: "square", style: "tinted", colour: severityPalette.major, words: "Major" },
  minor: { shape: "hexagon", style: "hollow", colour: severityPalette.minor, words: "Minor" },
  overdue: { shape: "clock", style: "hollow", colour: overdueColour, words: "Overdue" },
  barColour: {
    shape: "bar",
    style: "solid",
    colour: chartPalette.value,
    words: "Bars of this colour",
  },
} as const satisfies Record<string, Marker>;
export type MarkerName = keyof typeof markers;

/** The severity markers by severity code (the trade's words; they do not change). */
export const severityMarkers = {
  critical: markers.critical,
  major: markers.major,
  minor: markers.minor,
} as const;

/** Lines on the charts, each drawn one way only. */
export const chartLines = {
  centre: { dash: undefined, colour: chartPalette.reference, width: 2, words: "Centre line" },
  allSites: { dash: "1 3", colour: chartPalette.reference, width: 2, words: "All sites together" },
  limits: { dash: "5 3", colour: chartPalette.flagged, width: 1.5, words: "Control limits" },
  interval: { dash: undefined, colour: chartPalette.reference, width: 2, words: "95% interval" },
} as const;

const n = (value: number) => Number(value.toFixed(2));

/** The outline of a shape centred on (cx, cy), reaching about r from the centre. */
export function markerPath(shape: MarkerShape, cx: number, cy: number, r: number): string {
  switch (shape) {
    case "circle":
    case "ring":
      return `M${n(cx - r)} ${n(cy)}a${n(r)} ${n(r)} 0 1 0 ${n(2 * r)} 0a${n(r)} ${n(r)} 0 1 0 ${n(-2 * r)} 0Z`;
    case "clock":
      // A ring with two hands.
      return `${markerPath("ring", cx, cy, r)}M${n(cx)} ${n(cy - 0.55 * r)}V${n(cy)}l${n(0.35 * r)} ${n(0.25 * r)}`;
    case "triangle":
      return `M${n(cx)} ${n(cy - r)}L${n(cx + r)} ${n(cy + 0.8 * r)}H${n(cx - r)}Z`;
    case "diamond":
      return `M${n(cx)} ${n(cy - r)}L${n(cx + r)} ${n(cy)}L${n(cx)} ${n(cy + r)}L${n(cx - r)} ${n(cy)}Z`;
    case "square":
      return `M${n(cx - 0.78 * r)} ${n(cy - 0.78 * r)}h${n(1.56 * r)}v${n(1.56 * r)}h${n(-1.56 * r)}Z`;
    case "hexagon": {
      const points = [0, 1, 2, 3, 4, 5].map((i) => {
        const angle = (Math.PI / 3) * i;
        return `${n(cx + r * Math.cos(angle))} ${n(cy + r * Math.sin(angle))}`;
      });
      return `M${points.join("L")}Z`;
    }
    case "bar":
      return `M${n(cx - r)} ${n(cy - 0.45 * r)}h${n(2 * r)}v${n(0.9 * r)}h${n(-2 * r)}Z`;
  }
}

/** Paint attributes for a marker, in SVG attribute names. */
export function markerPaint(marker: Marker, strokeWidth = 2): Record<string, string | number> {
  switch (marker.style) {
    case "solid":
      return { fill: marker.colour, stroke: "#ffffff", "stroke-width": strokeWidth / 2 };
    case "hollow":
      return { fill: "#ffffff", stroke: marker.colour, "stroke-width": strokeWidth };
    case "tinted":
      return {
        fill: marker.colour,
        "fill-opacity": 0.25,
        stroke: marker.colour,
        "stroke-width": strokeWidth,
        "stroke-linejoin": "round",
      };
  }
}

/** The marker as SVG markup for a 24-unit square (map pins and keys built as HTML). */
export function markerMarkup(name: MarkerName, size = 24): string {
  const marker: Marker = markers[name];
  const c = size / 2;
  const r = size * 0.4;
  const paint = Object.entries(markerPaint(marker, size / 10))
    .map(([key, value]) => `${key}="${value}"`)
    .join(" ");
  return `<path data-marker="${name}" d="${markerPath(marker.shape, c, c, r)}" ${paint} stroke-linecap="round"/>`;
}
