import type { PlanPoint } from "@shared/calc/plan-geometry";

/**
 * Something a page pins on a plan without the map knowing what it is: the page supplies the
 * marker's markup (our own symbols), its accessible title and what a tap does.
 */
export interface MapPin {
  id: string;
  /** Plan units of the floor. */
  position: PlanPoint;
  /** Fixed markup drawn inside a 36 px marker. */
  html: string;
  title: string;
  onSelect?: () => void;
}

export interface PlacedPin extends MapPin {
  /** Screen pixels to draw the marker away from its point, so stacked pins stay tappable. */
  offset: readonly [number, number];
}

const markerSize = 36;

/**
 * Pins at the same point are fanned out on a small circle, far enough apart that each marker can
 * be tapped on its own. The offset is in screen pixels, so it holds at every zoom.
 */
export function spreadPins(pins: readonly MapPin[]): PlacedPin[] {
  const groups = new Map<string, MapPin[]>();
  for (const pin of pins) {
    const key = `${Math.round(pin.position.x)},${Math.round(pin.position.y)}`;
    const group = groups.get(key);
    if (group) group.push(pin);
    else groups.set(key, [pin]);
  }
  const placed: PlacedPin[] = [];
  for (const group of groups.values()) {
    if (group.length === 1) {
      placed.push({ ...group[0]!, offset: [0, 0] });
      continue;
    }
    const radius = (markerSize + 4) / 2 / Math.sin(Math.PI / Math.max(group.length, 2));
    group.forEach((pin, index) => {
      const angle = (2 * Math.PI * index) / group.length - Math.PI / 2;
      placed.push({
        ...pin,
        offset: [Math.round(Math.cos(angle) * radius), Math.round(Math.sin(angle) * radius)],
      });
    });
  }
  return placed;
}

export const pinMarkerSize = markerSize;
