import { minimumRankedSample, type Proportion } from "../schemas/committee";
import { wilsonInterval } from "./statistics";

/** The confidence level of every committee interval. */
export const committeeConfidence = 0.95;

/**
 * A committee proportion: the count, the rate, its Wilson score interval, and whether the sample
 * is too small to rank (Lintel's rule, `minimumRankedSample`).
 */
export function proportion(successes: number, n: number): Proportion {
  return {
    n,
    successes,
    rate: n === 0 ? null : successes / n,
    interval: n === 0 ? null : wilsonInterval(successes, n, committeeConfidence),
    smallSample: n < minimumRankedSample,
  };
}
