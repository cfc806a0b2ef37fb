import { distanceMetres, inchesToMetres, type PlanPoint } from "./plan-geometry";

/**
 * Alcohol-based hand-rub dispensers must be at least 48 in apart horizontally — NFPA 101 Life
 * Safety Code (2012), 18.3.2.6 (new) and 19.3.2.6 (existing health care occupancies).
 * 48 in = 1219.2 mm exactly.
 */
export const minimumDispenserSpacingMetres = inchesToMetres(48);

/**
 * A micrometre: far below what anyone can place on a plan, far above the rounding of a distance
 * worked out from plan units and a scale, so two dispensers placed exactly 48 in apart are never
 * flagged because 1.2192 came out as 1.2191999999999998 at some scale.
 */
export const spacingToleranceMetres = 1e-6;

export interface Dispenser extends PlanPoint {
  id: string;
}

export interface SpacingFlag {
  a: string;
  b: string;
  distanceMetres: number;
}

/** A floor scale that can measure anything: a finite number of metres per plan unit above zero. */
export function isUsableScale(metresPerUnit: number | null | undefined): metresPerUnit is number {
  return typeof metresPerUnit === "number" && Number.isFinite(metresPerUnit) && metresPerUnit > 0;
}

/** Closer than the NFPA 101 minimum, allowing only for floating-point rounding. */
export function isTooClose(distance: number): boolean {
  return distance < minimumDispenserSpacingMetres - spacingToleranceMetres;
}

/**
 * Every pair of dispensers on one floor closer than the minimum; nothing without a floor scale.
 * A scale of zero, below zero or not a finite number is a programming error here: the server
 * refuses such a scale before it is stored.
 */
export function closeDispenserPairs(
  dispensers: readonly Dispenser[],
  metresPerUnit: number | null,
): SpacingFlag[] {
  if (metresPerUnit === null) return [];
  if (!isUsableScale(metresPerUnit)) {
    throw new RangeError("The floor scale must be a number of metres per plan unit above zero.");
  }
  const flags: SpacingFlag[] = [];
  for (let i = 0; i < dispensers.length; i += 1) {
    for (let j = i + 1; j < dispensers.length; j += 1) {
      const distance = distanceMetres(dispensers[i]!, dispensers[j]!, metresPerUnit);
      if (isTooClose(distance)) {
        flags.push({ a: dispensers[i]!.id, b: dispensers[j]!.id, distanceMetres: distance });
      }
    }
  }
  return flags;
}
