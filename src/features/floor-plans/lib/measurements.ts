import { metresPerFoot, polygonArea } from "@shared/calc/plan-geometry";

const squareFeetPerSquareMetre = 1 / (metresPerFoot * metresPerFoot);

/** The area of a drawn outline in square metres, or null while the floor has no scale. */
export function planAreaSquareMetres(
  polygon: readonly (readonly [number, number])[],
  metresPerUnit: number | null,
): number | null {
  if (metresPerUnit === null) return null;
  return polygonArea(polygon) * metresPerUnit * metresPerUnit;
}

/** "12.30 m² (132.4 ft²)" */
export function formatArea(squareMetres: number): string {
  return `${squareMetres.toFixed(2)} m² (${(squareMetres * squareFeetPerSquareMetre).toFixed(1)} ft²)`;
}

/** "0.0125 m per plan unit": four significant figures are finer than any plan is drawn. */
export function formatScale(metresPerUnit: number): string {
  return `${Number(metresPerUnit.toPrecision(4))} m per plan unit`;
}
