import type { PlanPoint } from "@shared/calc/plan-geometry";

/**
 * The one place that turns plan units (x right, y down from the plan's top-left) into the
 * latitude/longitude Leaflet uses on its flat CRS.Simple, where latitude grows upwards:
 * lat = -y, lng = x. Everything on the map goes through here and nowhere else.
 */
export type LatLngPair = [lat: number, lng: number];

export interface LatLngLike {
  lat: number;
  lng: number;
}

export interface PlanSize {
  width: number;
  height: number;
}

export function planToLatLng(point: PlanPoint): LatLngPair {
  return [-point.y + 0, point.x + 0];
}

export function latLngToPlan(latLng: LatLngLike): PlanPoint {
  return { x: latLng.lng + 0, y: -latLng.lat + 0 };
}

/** South-west and north-east corners covering the whole plan, for the image and fitting. */
export function planBounds(size: PlanSize): [LatLngPair, LatLngPair] {
  return [
    [-size.height + 0, 0],
    [0, size.width],
  ];
}

export function polygonToLatLngs(polygon: readonly (readonly [number, number])[]): LatLngPair[] {
  return polygon.map(([x, y]) => planToLatLng({ x, y }));
}

export function pointsToPolygon(points: readonly PlanPoint[]): [number, number][] {
  return points.map((point) => [point.x, point.y]);
}

/**
 * A tapped point kept to whole plan units. A unit is one pixel of the plan image, finer than any
 * drawing is true to, and what is stored is then exactly what the readout shows.
 */
export function tidyPlanPoint(point: PlanPoint): PlanPoint {
  return { x: Math.round(point.x) + 0, y: Math.round(point.y) + 0 };
}

export function formatPlanPoint(point: PlanPoint): string {
  const { x, y } = tidyPlanPoint(point);
  return `x ${x}, y ${y}`;
}
