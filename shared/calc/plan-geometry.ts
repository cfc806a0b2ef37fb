/**
 * Floor-plan geometry. Positions are in the plan's own units: x to the right and y downwards from
 * the plan's top-left corner, one unit per pixel of the first plan uploaded for the floor.
 * A floor's scale is metres per plan unit, set once from two points and their real distance.
 */
export interface PlanPoint {
  x: number;
  y: number;
}

/** Exact by definition (international yard and pound, 1959): 1 in = 25.4 mm, 1 ft = 0.3048 m. */
export const metresPerInch = 0.0254;
export const metresPerFoot = 0.3048;

export const metresToInches = (metres: number) => metres / metresPerInch;
export const metresToFeet = (metres: number) => metres / metresPerFoot;
export const inchesToMetres = (inches: number) => inches * metresPerInch;
export const feetToMetres = (feet: number) => feet * metresPerFoot;

export function planDistance(a: PlanPoint, b: PlanPoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y);
}

/** Metres per plan unit from two points whose real distance is known. */
export function scaleFromReference(a: PlanPoint, b: PlanPoint, distanceMetres: number): number {
  const units = planDistance(a, b);
  if (!(units > 0)) throw new RangeError("The two reference points must be apart.");
  if (!(distanceMetres > 0)) throw new RangeError("The real distance must be more than zero.");
  const scale = distanceMetres / units;
  // Points a hair apart, or a vanishing distance, can overflow to Infinity or round to zero.
  if (!Number.isFinite(scale) || !(scale > 0)) {
    throw new RangeError("The scale must come out as a finite number above zero.");
  }
  return scale;
}

export function distanceMetres(a: PlanPoint, b: PlanPoint, metresPerUnit: number): number {
  return planDistance(a, b) * metresPerUnit;
}

/** Ray casting; points on an edge count as inside only by chance, so keep markers off edges. */
export function pointInPolygon(
  point: PlanPoint,
  polygon: readonly (readonly [number, number])[],
): boolean {
  let inside = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i, i += 1) {
    const [xi, yi] = polygon[i]!;
    const [xj, yj] = polygon[j]!;
    const crosses =
      yi > point.y !== yj > point.y && point.x < ((xj - xi) * (point.y - yi)) / (yj - yi) + xi;
    if (crosses) inside = !inside;
  }
  return inside;
}

/** Shoelace formula, in square plan units. */
export function polygonArea(polygon: readonly (readonly [number, number])[]): number {
  let twice = 0;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i, i += 1) {
    twice += polygon[j]![0] * polygon[i]![1] - polygon[i]![0] * polygon[j]![1];
  }
  return Math.abs(twice) / 2;
}

/** Formats a length for people on both sides of the Atlantic: "1.00 m (3 ft 3.4 in)". */
export function formatLength(metres: number): string {
  const totalInches = metresToInches(metres);
  let feet = Math.floor(totalInches / 12);
  let inches = Math.round((totalInches - feet * 12) * 10) / 10;
  if (inches >= 12) {
    feet += 1;
    inches -= 12;
  }
  return `${metres.toFixed(2)} m (${feet} ft ${inches.toFixed(1)} in)`;
}

/**
 * The area centroid of a simple polygon (the shoelace formula's first moments); the mean of the
 * corners when the polygon has no area. Where a finding's pin goes in its space.
 */
export function polygonCentroid(polygon: readonly (readonly [number, number])[]): PlanPoint {
  if (polygon.length === 0) throw new RangeError("A polygon needs at least one corner.");
  let twice = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i, i += 1) {
    const [xj, yj] = polygon[j]!;
    const [xi, yi] = polygon[i]!;
    const cross = xj * yi - xi * yj;
    twice += cross;
    cx += (xj + xi) * cross;
    cy += (yj + yi) * cross;
  }
  if (twice === 0) {
    const n = polygon.length;
    return {
      x: polygon.reduce((sum, [x]) => sum + x, 0) / n,
      y: polygon.reduce((sum, [, y]) => sum + y, 0) / n,
    };
  }
  return { x: cx / (3 * twice), y: cy / (3 * twice) };
}
