import { distanceMetres, inchesToMetres, type PlanPoint } from "./plan-geometry";

/**
 * Alcohol-based hand-rub dispensers must be at least 48 in apart horizontally — NFPA 101 Life
 * Safety Code (2012), 18.3.2.6 (new) and 19.3.2.6 (existing health care occupancies).
 * 48 in = 1219.2 mm exactly.
 */
export const minimumDispenserSpacingMetres = inchesToMetres(48);

export interface Dispenser extends PlanPoint {
  id: string;
}

export interface SpacingFlag {
  a: string;
  b: string;
  distanceMetres: number;
}

/** Every pair of dispensers on one floor closer than the minimum; nothing without a floor scale. */
export function closeDispenserPairs(
  dispensers: readonly Dispenser[],
  metresPerUnit: number | null,
): SpacingFlag[] {
  if (metresPerUnit === null) return [];
  const flags: SpacingFlag[] = [];
  for (let i = 0; i < dispensers.length; i += 1) {
    for (let j = i + 1; j < dispensers.length; j += 1) {
      const distance = distanceMetres(dispensers[i]!, dispensers[j]!, metresPerUnit);
      if (distance < minimumDispenserSpacingMetres) {
        flags.push({ a: dispensers[i]!.id, b: dispensers[j]!.id, distanceMetres: distance });
      }
    }
  }
  return flags;
}
