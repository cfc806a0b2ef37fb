import jstat from "jstat";

import { type Interval } from "./statistics";

/**
 * Exact intervals for counts of events over an exposure: how many excursions a site's rooms had
 * in the hours they were monitored. Garwood's interval inverts the Poisson test with chi-square
 * quantiles, so it never falls below zero and holds for a count of zero.
 */

function assertConfidence(confidence: number): void {
  if (!(confidence > 0 && confidence < 1))
    throw new RangeError("The confidence level must be strictly between 0 and 1.");
}

/**
 * Exact (Garwood 1936) interval for the mean of a Poisson count: lower = χ²(α/2; 2k) / 2 (0 when
 * k = 0), upper = χ²(1 − α/2; 2k + 2) / 2.
 */
export function poissonInterval(count: number, confidence = 0.95): Interval {
  if (!Number.isInteger(count) || count < 0)
    throw new RangeError("The count must be a whole number, zero or more.");
  assertConfidence(confidence);
  const alpha = 1 - confidence;
  const { chisquare } = jstat.jStat;
  return {
    lower: count === 0 ? 0 : chisquare.inv(alpha / 2, 2 * count) / 2,
    upper: chisquare.inv(1 - alpha / 2, 2 * count + 2) / 2,
  };
}

export interface EventRate extends Interval {
  count: number;
  exposureHours: number;
  /** Events per `per` hours. */
  rate: number;
  per: number;
}

/**
 * Events per `per` monitored hours (1,000 by default) with the exact interval of the count,
 * scaled by the same factor. Null when nothing was monitored: a rate over no time has no meaning.
 */
export function eventRate(
  count: number,
  exposureHours: number,
  per = 1000,
  confidence = 0.95,
): EventRate | null {
  if (!Number.isFinite(exposureHours) || exposureHours < 0)
    throw new RangeError("The monitored hours must be a number, zero or more.");
  if (!(per > 0)) throw new RangeError("The rate's base must be above zero.");
  const interval = poissonInterval(count, confidence);
  if (exposureHours === 0) return null;
  const scale = per / exposureHours;
  return {
    count,
    exposureHours,
    per,
    rate: count * scale,
    lower: interval.lower * scale,
    upper: interval.upper * scale,
  };
}
