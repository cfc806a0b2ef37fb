import jstat from "jstat";
import { describe, expect, it } from "vitest";

import {
  median,
  normalQuantile,
  pChart,
  proportionDifferenceInterval,
  wilsonInterval,
} from "@shared/calc/statistics";

const { jStat } = jstat;
const round4 = (value: number) => Math.round(value * 10_000) / 10_000;
const rounded = (interval: { lower: number; upper: number }) => [
  round4(interval.lower),
  round4(interval.upper),
];

describe("Wilson score interval", () => {
  // Newcombe RG. Two-sided confidence intervals for the single proportion: comparison of seven
  // methods. Statistics in Medicine 1998;17:857–872, Table I, method 3 (score, no continuity
  // correction). z = 1.959963984540054.
  it("when checked against Newcombe (1998a), Table I, then every published interval matches to 4 places", () => {
    expect(rounded(wilsonInterval(81, 263))).toEqual([0.2553, 0.3662]); // Newcombe 1998a, confirmed
    expect(rounded(wilsonInterval(15, 148))).toEqual([0.0624, 0.1605]); // Newcombe 1998a, confirmed
    expect(rounded(wilsonInterval(0, 10))).toEqual([0, 0.2775]); // Newcombe 1998a, confirmed
  });

  it("when the count is 0 or small, then the interval matches the values computed from Newcombe's formula", () => {
    expect(rounded(wilsonInterval(0, 20))).toEqual([0, 0.1611]); // computed (references §7)
    expect(rounded(wilsonInterval(1, 29))).toEqual([0.0061, 0.1718]); // computed (references §7)
    // Every audit ready: the upper bound is exactly 1, the lower bound below it.
    const all = wilsonInterval(29, 29);
    expect(all.upper).toBe(1);
    expect(round4(all.lower)).toBe(0.883);
  });

  it("when cross-checked with jStat, then z is jStat's normal quantile and each bound is where the score test reaches it", () => {
    // jStat.normal.inv(0.975, 0, 1) = 1.9599639845400545 (references §7).
    expect(normalQuantile(0.95)).toBe(jStat.normal.inv(0.975, 0, 1));
    expect(normalQuantile(0.95)).toBeCloseTo(1.959963984540054, 15);
    for (const [x, n] of [
      [81, 263],
      [15, 148],
      [1, 29],
      [7, 12],
    ] as const) {
      const { lower, upper } = wilsonInterval(x, n);
      const p = x / n;
      // The Wilson bounds solve (p − π)/√(π(1 − π)/n) = ±z: the normal CDF there is 0.975 / 0.025.
      expect(
        jStat.normal.cdf((p - lower) / Math.sqrt((lower * (1 - lower)) / n), 0, 1),
      ).toBeCloseTo(0.975, 10);
      expect(
        jStat.normal.cdf((p - upper) / Math.sqrt((upper * (1 - upper)) / n), 0, 1),
      ).toBeCloseTo(0.025, 10);
    }
  });

  it("when a level is asked for again, then the kept quantile is the one worked out, and a refused level stays refused", () => {
    // Two-sided standard normal quantiles 1.644854 (90%) and 2.575829 (99%): table values from
    // memory, cross-checked below with jStat, the library references §7 names.
    for (const [confidence, z] of [
      [0.9, 1.6448536269514722],
      [0.99, 2.5758293035489004],
    ] as const) {
      const first = normalQuantile(confidence);
      expect(first).toBeCloseTo(z, 12);
      expect(normalQuantile(confidence)).toBe(first);
    }
    // A refused level is never kept: asking twice refuses twice.
    for (const bad of [0, 1, 1.5, Number.NaN]) {
      expect(() => normalQuantile(bad)).toThrow(RangeError);
      expect(() => normalQuantile(bad)).toThrow(RangeError);
    }
    // Many levels in turn (a caller sweeping them) each get their own quantile.
    for (let n = 1; n < 200; n += 1) {
      const confidence = n / 200;
      expect(normalQuantile(confidence)).toBe(jStat.normal.inv(1 - (1 - confidence) / 2, 0, 1));
    }
  });

  it("when the confidence level changes, then the interval widens or narrows with it", () => {
    const ninety = wilsonInterval(81, 263, 0.9);
    const ninetyNine = wilsonInterval(81, 263, 0.99);
    const standard = wilsonInterval(81, 263);
    expect(ninety.upper - ninety.lower).toBeLessThan(standard.upper - standard.lower);
    expect(ninetyNine.upper - ninetyNine.lower).toBeGreaterThan(standard.upper - standard.lower);
  });

  it("when the input has no meaning, then a RangeError is thrown", () => {
    for (const [x, n] of [
      [-1, 10],
      [1.5, 10],
      [11, 10],
      [0, 0],
      [1, 2.5],
    ]) {
      expect(() => wilsonInterval(x!, n!)).toThrow(RangeError);
    }
    for (const confidence of [0, 1, -0.5, 1.2, Number.NaN]) {
      expect(() => wilsonInterval(5, 10, confidence)).toThrow(RangeError);
    }
  });
});

describe("difference of two proportions", () => {
  // Newcombe RG. Interval estimation for the difference between independent proportions:
  // comparison of eleven methods. Statistics in Medicine 1998;17:873–890, method 10 (hybrid score).
  it("when checked against Newcombe (1998b), then 56/70 − 48/80 gives 0.0524 to 0.3339", () => {
    // Confirmed in public test suites (references §7).
    expect(rounded(proportionDifferenceInterval(56, 70, 48, 80))).toEqual([0.0524, 0.3339]);
  });

  it("when checked against Newcombe (1998b), Table II, then the other examples match too (from memory; computed values agree)", () => {
    expect(rounded(proportionDifferenceInterval(9, 10, 3, 10))).toEqual([0.1705, 0.809]);
    expect(rounded(proportionDifferenceInterval(5, 56, 0, 29))).toEqual([-0.0381, 0.1926]);
    expect(rounded(proportionDifferenceInterval(0, 10, 0, 20))).toEqual([-0.1611, 0.2775]);
    expect(rounded(proportionDifferenceInterval(10, 10, 0, 20))).toEqual([0.6791, 1]);
  });

  it("when the sites are swapped, then the interval is mirrored", () => {
    const ab = proportionDifferenceInterval(56, 70, 48, 80);
    const ba = proportionDifferenceInterval(48, 80, 56, 70);
    expect(ba.lower).toBeCloseTo(-ab.upper, 12);
    expect(ba.upper).toBeCloseTo(-ab.lower, 12);
  });

  it("when either sample has no meaning, then a RangeError is thrown", () => {
    expect(() => proportionDifferenceInterval(5, 0, 1, 10)).toThrow(RangeError);
    expect(() => proportionDifferenceInterval(5, 10, 11, 10)).toThrow(RangeError);
    expect(() => proportionDifferenceInterval(5, 10, 1, 10, 1)).toThrow(RangeError);
  });
});

describe("p-chart", () => {
  // Montgomery DC, Introduction to Statistical Quality Control, 6th ed., Example 7.1: 30 samples
  // of n = 50 with 347 nonconforming in all → p̄ = 0.2313, UCL = 0.4102, LCL = 0.0524, samples 15
  // and 23 above the UCL (from memory; the computed values match). Limits p̄ ± 3√(p̄(1 − p̄)/n) as
  // in Benneyan, Infect Control Hosp Epidemiol 1998;19 (confirmed abstract).
  const example71 = [
    12, 15, 8, 10, 4, 7, 16, 9, 14, 10, 5, 6, 17, 12, 22, 8, 10, 5, 13, 11, 20, 18, 24, 15, 9, 12,
    7, 13, 9, 6,
  ];

  it("when checked against Montgomery's Example 7.1, then the centre, limits and signals match", () => {
    expect(example71.reduce((sum, d) => sum + d, 0)).toBe(347);
    const chart = pChart(example71.map((defects) => ({ defects, n: 50 })));
    expect(round4(chart.centre)).toBe(0.2313);
    expect(round4(chart.points[0]!.upper)).toBe(0.4102);
    expect(round4(chart.points[0]!.lower)).toBe(0.0524);
    const signals = chart.points.flatMap((point, index) => (point.outside ? [index + 1] : []));
    expect(signals).toEqual([15, 23]);
  });

  it("when monthly sample sizes vary, then each month has its own limits and a low lower limit is clamped at 0", () => {
    const chart = pChart([
      { defects: 2, n: 40 },
      { defects: 3, n: 10 },
      { defects: 0, n: 5 },
    ]);
    expect(chart.centre).toBeCloseTo(5 / 55, 15);
    const sigma = (n: number) => Math.sqrt((chart.centre * (1 - chart.centre)) / n);
    expect(chart.points[0]!.upper).toBeCloseTo(chart.centre + 3 * sigma(40), 15);
    expect(chart.points[1]!.upper).toBeCloseTo(chart.centre + 3 * sigma(10), 15);
    expect(chart.points.every((point) => point.lower === 0)).toBe(true);
    expect(chart.points[1]).toMatchObject({ p: 0.3, outside: false });
  });

  it("when a point sits exactly on a limit, then it is not outside; beyond it, it is", () => {
    // All defective → p̄ = 1, σ = 0: limits 1 and 1; p = 1 is on the limit, not beyond.
    expect(pChart([{ defects: 4, n: 4 }]).points[0]).toMatchObject({
      lower: 1,
      upper: 1,
      outside: false,
    });
    const chart = pChart([
      { defects: 0, n: 100 },
      { defects: 0, n: 100 },
      { defects: 30, n: 100 },
    ]);
    // p̄ = 0.1, σ = 0.03: limits 0.01 and 0.19; 0.30 is above, and 0 is below the lower limit.
    expect(chart.points[2]!.outside).toBe(true);
    expect(chart.points[0]!.lower).toBeCloseTo(0.01, 12);
    expect(chart.points[0]!.outside).toBe(true);
  });

  it("when there are no subgroups or a subgroup has no meaning, then a RangeError is thrown", () => {
    expect(() => pChart([])).toThrow(RangeError);
    expect(() => pChart([{ defects: 1, n: 0 }])).toThrow(RangeError);
    expect(() => pChart([{ defects: 6, n: 5 }])).toThrow(RangeError);
    expect(() => pChart([{ defects: -1, n: 5 }])).toThrow(RangeError);
    expect(() => pChart([{ defects: 0.5, n: 5 }])).toThrow(RangeError);
  });
});

describe("median", () => {
  it("when the count is odd or even, then the middle value or the mean of the two middle ones", () => {
    expect(median([5, 1, 3])).toBe(3);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNull();
  });
});
