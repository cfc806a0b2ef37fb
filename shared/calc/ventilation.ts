/**
 * Ventilation arithmetic an auditor needs at an isolation room. Stored units are SI: Pa for
 * pressure, m³ for volume, m³/h for airflow. These are the auditor's readings, not a certification.
 */

/** 1 ft = 0.3048 m exactly, so 1 ft³ = 0.3048³ m³ = 0.028316846592 m³. */
export const cubicMetresPerCubicFoot = 0.3048 ** 3;

/**
 * One inch of water column (conventional, water at 1000 kg/m³ under standard gravity):
 * 0.0254 m × 9.80665 m/s² × 1000 kg/m³ = 249.08891 Pa.
 */
export const pascalsPerInchOfWater = 0.0254 * 9.80665 * 1000;

function assertFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new RangeError(`${what} must be a finite number.`);
}

export function cubicFeetToCubicMetres(cubicFeet: number): number {
  assertFinite(cubicFeet, "Volume");
  return cubicFeet * cubicMetresPerCubicFoot;
}

/** Cubic feet per minute → cubic metres per hour. */
export function cfmToCubicMetresPerHour(cfm: number): number {
  assertFinite(cfm, "Airflow");
  return cfm * cubicMetresPerCubicFoot * 60;
}

export function pascalsToInchesOfWater(pascals: number): number {
  assertFinite(pascals, "Pressure");
  return pascals / pascalsPerInchOfWater;
}

export function inchesOfWaterToPascals(inches: number): number {
  assertFinite(inches, "Pressure");
  return inches * pascalsPerInchOfWater;
}

/** ACH = exhaust airflow per hour ÷ room volume. */
export function airChangesPerHour(
  airflowCubicMetresPerHour: number,
  volumeCubicMetres: number,
): number {
  if (!Number.isFinite(airflowCubicMetresPerHour) || airflowCubicMetresPerHour < 0) {
    throw new RangeError("Airflow must be a finite number, zero or more.");
  }
  if (!Number.isFinite(volumeCubicMetres) || volumeCubicMetres <= 0) {
    throw new RangeError("Room volume must be a finite number above zero.");
  }
  return airflowCubicMetresPerHour / volumeCubicMetres;
}

/**
 * Minutes for airborne contaminants to fall by `efficiencyPercent` in an empty, perfectly mixed
 * room: t = −ln(1 − efficiency/100) ÷ ACH × 60. Imperfect mixing takes longer.
 */
export function purgeMinutes(airChanges: number, efficiencyPercent: number): number {
  if (!Number.isFinite(airChanges) || airChanges <= 0)
    throw new RangeError("Air changes per hour must be above zero.");
  if (!Number.isFinite(efficiencyPercent) || efficiencyPercent <= 0 || efficiencyPercent >= 100) {
    throw new RangeError("Removal efficiency must be between 0 and 100 percent, exclusive.");
  }
  return (-Math.log(1 - efficiencyPercent / 100) / airChanges) * 60;
}

/**
 * Minimum air changes per hour for an airborne infection isolation room by construction class:
 * 12 for new construction or renovation, 6 for existing rooms (to be raised to 12 where feasible).
 */
export const minimumAirChanges = { new_or_renovated: 12, existing: 6 } as const;

type ConstructionClass = keyof typeof minimumAirChanges;

/**
 * The class a room is judged by. An isolation room saved before the class was required has none:
 * it is held to the stricter figure, new or renovated, until an administrator sets it.
 */
export function judgedConstructionClass(
  zoneType: string,
  constructionClass: ConstructionClass | null,
): ConstructionClass | null {
  if (constructionClass) return constructionClass;
  return zoneType === "isolation_room" ? "new_or_renovated" : null;
}

/** The air-change minimum a room is judged by, or null where none applies. */
export function minimumAirChangesFor(
  zoneType: string,
  constructionClass: ConstructionClass | null,
): number | null {
  const judged = judgedConstructionClass(zoneType, constructionClass);
  return judged ? minimumAirChanges[judged] : null;
}

/** How the minimum is shown wherever it appears, so every screen says the same thing. */
export function minimumAirChangesLabel(constructionClass: ConstructionClass): string {
  return constructionClass === "existing"
    ? `≥ ${minimumAirChanges.existing} (existing rooms only; CDC: raise to ${minimumAirChanges.new_or_renovated} where feasible)`
    : `≥ ${minimumAirChanges.new_or_renovated} (new or renovated)`;
}

/** Said beside an isolation room that has no construction class yet. */
export const noConstructionClassNotice = `No construction class set: judged as new or renovated, ≥ ${minimumAirChanges.new_or_renovated} air changes per hour, until an administrator sets it.`;

/** Typed and worked-out air changes further apart than this share of the worked-out figure disagree. */
export const airChangesTolerance = 0.1;

/**
 * Whether the air changes typed by the auditor agree with those worked out from airflow and room
 * volume: within 10 % of the worked-out figure. Lintel's own rule: a wider gap means one of the
 * readings, or the recorded volume, is wrong, and the auditor must say which figure is right.
 */
export function airChangesAgree(typed: number, computed: number): boolean {
  if (!Number.isFinite(typed) || !Number.isFinite(computed)) return false;
  if (computed === 0) return typed === 0;
  // A hair of slack so that exactly 10 % apart, after floating point, still agrees.
  return Math.abs(typed - computed) <= airChangesTolerance * Math.abs(computed) * (1 + 1e-12);
}

/**
 * At least 2.5 Pa negative to the corridor; the CDC states the same differential as 0.01 in. w.c.
 * (water gauge), which is 2.49 Pa: a reading is judged against the figure stated in its own unit.
 */
export const minimumNegativePressurePascals = 2.5;
export const negativePressureInchesOfWater = 0.01;
