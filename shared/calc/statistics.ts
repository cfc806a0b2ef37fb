import jstat from "jstat";

/**
 * Statistics for comparing sites honestly: score intervals for proportions and their differences,
 * and the p-chart for monthly readiness. Every function refuses input that has no meaning.
 */

export interface Interval {
  lower: number;
  upper: number;
}

function assertCount(value: number, what: string): void {
  if (!Number.isInteger(value) || value < 0)
    throw new RangeError(`${what} must be a whole number, zero or more.`);
}

function assertProportionInput(successes: number, n: number): void {
  assertCount(successes, "The count");
  assertCount(n, "The sample size");
  if (n === 0) throw new RangeError("The sample size must be at least 1.");
  if (successes > n) throw new RangeError("The count cannot exceed the sample size.");
}

/**
 * Quantiles already worked out, by confidence level. The committee's figures ask for the same one
 * or two levels hundreds of times a request, and each inversion allocates as it iterates.
 */
const quantiles = new Map<number, number>();

/** The two-sided normal quantile for a confidence level, e.g. 1.959964 for 0.95. */
export function normalQuantile(confidence: number): number {
  const known = quantiles.get(confidence);
  if (known !== undefined) return known;
  if (!(confidence > 0 && confidence < 1))
    throw new RangeError("The confidence level must be strictly between 0 and 1.");
  const z = jstat.jStat.normal.inv(1 - (1 - confidence) / 2, 0, 1);
  // Bounded: only the levels the product uses reach here, but a caller looping over many
  // levels must not grow the map without end.
  if (quantiles.size < 64) quantiles.set(confidence, z);
  return z;
}

/** Wilson score interval for successes / n (Newcombe 1998, method 3). */
export function wilsonInterval(successes: number, n: number, confidence = 0.95): Interval {
  assertProportionInput(successes, n);
  const z = normalQuantile(confidence);
  const p = successes / n;
  const z2 = z * z;
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / (1 + z2 / n);
  // At 0 or n the formula gives the bound exactly; clamp away rounding below 0 or above 1.
  return {
    lower: successes === 0 ? 0 : Math.max(0, centre - half),
    upper: successes === n ? 1 : Math.min(1, centre + half),
  };
}

/**
 * Interval for p1 − p2 by Newcombe's hybrid score method (1998, method 10), built from the two
 * Wilson intervals.
 */
export function proportionDifferenceInterval(
  x1: number,
  n1: number,
  x2: number,
  n2: number,
  confidence = 0.95,
): Interval {
  const first = wilsonInterval(x1, n1, confidence);
  const second = wilsonInterval(x2, n2, confidence);
  const p1 = x1 / n1;
  const p2 = x2 / n2;
  const d = p1 - p2;
  return {
    lower: Math.max(-1, d - Math.sqrt((p1 - first.lower) ** 2 + (second.upper - p2) ** 2)),
    upper: Math.min(1, d + Math.sqrt((first.upper - p1) ** 2 + (p2 - second.lower) ** 2)),
  };
}

export interface PChartPoint {
  p: number;
  lower: number;
  upper: number;
  outside: boolean;
}

/**
 * Proportion control chart with 3-sigma limits for each subgroup's own size: centre p̄ = Σd / Σn,
 * limits p̄ ± 3·√(p̄(1 − p̄)/nᵢ), clamped to [0, 1]. A point is outside when strictly beyond a limit.
 */
export function pChart(subgroups: readonly { defects: number; n: number }[]): {
  centre: number;
  points: PChartPoint[];
} {
  if (subgroups.length === 0) throw new RangeError("A p-chart needs at least one subgroup.");
  let defects = 0;
  let total = 0;
  for (const subgroup of subgroups) {
    assertProportionInput(subgroup.defects, subgroup.n);
    defects += subgroup.defects;
    total += subgroup.n;
  }
  const centre = defects / total;
  const points = subgroups.map(({ defects: d, n }) => {
    const sigma = Math.sqrt((centre * (1 - centre)) / n);
    const lower = Math.max(0, centre - 3 * sigma);
    const upper = Math.min(1, centre + 3 * sigma);
    const p = d / n;
    return { p, lower, upper, outside: p > upper || p < lower };
  });
  return { centre, points };
}

/** The median of a list of numbers; null for an empty list. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}
