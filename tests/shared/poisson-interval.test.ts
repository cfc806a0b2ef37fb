import jstat from "jstat";
import { describe, expect, it } from "vitest";

import { eventRate, poissonInterval } from "@shared/calc/poisson-interval";

const { jStat } = jstat;
const round2 = (value: number) => Math.round(value * 100) / 100;

describe("exact (Garwood) Poisson interval", () => {
  it("when 25 events are counted, then the published 90%, 95% and 99% intervals", () => {
    // GraphPad, "How QuickCalcs computes the confidence interval of a count" (Garwood method):
    // 25 → 90% 17.38–34.92, 95% 16.18–36.90, 99% 14.00–41.00 (confirmed in the published FAQ).
    const cases: [number, number, number][] = [
      [0.9, 17.38, 34.92],
      [0.95, 16.18, 36.9],
      [0.99, 14.0, 41.0],
    ];
    for (const [confidence, lower, upper] of cases) {
      const interval = poissonInterval(25, confidence);
      expect([round2(interval.lower), round2(interval.upper)]).toEqual([lower, upper]);
    }
  });

  it("when no event is counted, then the interval is 0 to 3.689", () => {
    // R package epitools, pois.exact documentation: "When x = 0, for the upper confidence limit
    // pois.exact returns 3.689" (confirmed in its published help page).
    const interval = poissonInterval(0);
    expect(interval.lower).toBe(0);
    expect(Math.round(interval.upper * 1000) / 1000).toBe(3.689);
  });

  it("when checked against SciPy's chi-square quantiles, then every bound agrees to nine significant figures", () => {
    // Computed with SciPy 1.17.1: chi2.ppf(0.025, 2k) / 2 and chi2.ppf(0.975, 2k + 2) / 2.
    const scipy: [number, number, number][] = [
      [0, 0, 3.6888794541139354],
      [1, 0.025317807984289876, 5.571643390938898],
      [2, 0.24220927854396496, 7.22468766772396],
      [3, 0.6186721228956014, 8.767273069742323],
      [10, 4.7953886961324335, 18.39035604201778],
      [100, 81.36399125092314, 121.62679379242638],
      [1000, 938.9730184076952, 1063.952136016302],
    ];
    for (const [count, lower, upper] of scipy) {
      const interval = poissonInterval(count);
      expect(Math.abs(interval.lower - lower)).toBeLessThanOrEqual(1e-9 * Math.max(1, lower));
      expect(Math.abs(interval.upper - upper)).toBeLessThanOrEqual(1e-9 * upper);
    }
  });

  it("when the bounds are put back into the Poisson distribution, then each tail holds 2.5%", () => {
    // The defining property (Garwood 1936), checked with jStat's Poisson CDF rather than the
    // chi-square quantile the bounds came from: P(X ≥ k | lower) = P(X ≤ k | upper) = 0.025.
    for (const count of [1, 4, 17, 60]) {
      const { lower, upper } = poissonInterval(count);
      expect(1 - jStat.poisson.cdf(count - 1, lower)).toBeCloseTo(0.025, 9);
      expect(jStat.poisson.cdf(count, upper)).toBeCloseTo(0.025, 9);
    }
  });

  it("when the count or the confidence has no meaning, then it is refused", () => {
    expect(() => poissonInterval(-1)).toThrow(/whole number/);
    expect(() => poissonInterval(2.5)).toThrow(/whole number/);
    expect(() => poissonInterval(3, 1)).toThrow(/confidence/);
  });
});

describe("excursions per 1,000 monitored hours", () => {
  it("when 3 excursions happen in 1,500 monitored hours, then 2 per 1,000 hours with the count's interval scaled", () => {
    // 3 × 1000 / 1500 = 2; bounds 0.61867 × 1000/1500 = 0.41245 and 8.76727 × 1000/1500 = 5.84485
    // (count interval from SciPy 1.17.1, above).
    const rate = eventRate(3, 1500)!;
    expect(rate.rate).toBe(2);
    expect(rate.per).toBe(1000);
    expect(rate.lower).toBeCloseTo(0.6186721228956014 / 1.5, 9);
    expect(rate.upper).toBeCloseTo(8.767273069742323 / 1.5, 9);
  });

  it("when no excursion happens in 720 hours, then a rate of 0 with an upper bound of 3.689 × 1000/720", () => {
    const rate = eventRate(0, 720)!;
    expect(rate).toMatchObject({ rate: 0, lower: 0 });
    expect(rate.upper).toBeCloseTo((3.6888794541139354 * 1000) / 720, 9);
  });

  it("when nothing was monitored, then there is no rate; negative hours are refused", () => {
    expect(eventRate(0, 0)).toBeNull();
    expect(() => eventRate(1, -1)).toThrow(/monitored hours/);
  });
});
