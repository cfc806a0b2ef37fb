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

  it("when the counts 0 to 10 are looked up, then the bounds match the printed table of exact 95% Poisson limits", () => {
    // The standard printed table of exact (Garwood) 95% confidence limits for a Poisson count, as
    // reproduced in epidemiology and biostatistics reference tables (from memory; three decimals,
    // the same values as the SciPy checks below for the counts both list).
    const table: [number, string, string][] = [
      [0, "0", "3.689"],
      [1, "0.0253", "5.572"],
      [2, "0.242", "7.225"],
      [3, "0.619", "8.767"],
      [4, "1.090", "10.242"],
      [5, "1.623", "11.668"],
      [6, "2.202", "13.059"],
      [7, "2.814", "14.423"],
      [8, "3.454", "15.763"],
      [9, "4.115", "17.085"],
      [10, "4.795", "18.390"],
    ];
    // Within half a unit of the table's last printed digit.
    const agrees = (value: number, printed: string) =>
      Math.abs(value - Number(printed)) <= 0.5 * 10 ** -(printed.split(".")[1]?.length ?? 0);
    for (const [count, lower, upper] of table) {
      const interval = poissonInterval(count);
      expect(agrees(interval.lower, lower), `count ${count}: lower ${interval.lower}`).toBe(true);
      expect(agrees(interval.upper, upper), `count ${count}: upper ${interval.upper}`).toBe(true);
    }
  });

  it("when a bound is recomputed from jStat's chi-square quantile, then it is the same number", () => {
    // Garwood's relation written out once more: upper(k) = χ²(0.975; 2k + 2) / 2 and
    // lower(k) = χ²(0.025; 2k) / 2; for k = 7 that is χ²(0.975; 16) / 2 and χ²(0.025; 14) / 2.
    const interval = poissonInterval(7);
    expect(interval.upper).toBeCloseTo(jStat.chisquare.inv(0.975, 16) / 2, 12);
    expect(interval.lower).toBeCloseTo(jStat.chisquare.inv(0.025, 14) / 2, 12);
    // And the printed 95% chi-square quantiles for 14 and 16 degrees of freedom (5.629, 28.845).
    expect(Math.round(jStat.chisquare.inv(0.025, 14) * 1000) / 1000).toBe(5.629);
    expect(Math.round(jStat.chisquare.inv(0.975, 16) * 1000) / 1000).toBe(28.845);
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
