import { describe, expect, it } from "vitest";

import { scoreOf, verdictOf, type ScoredAnswer } from "@shared/calc/verdict";

// Lintel's own rules (not a published standard): see shared/calc/verdict.ts.
const answer = (
  severity: ScoredAnswer["severity"],
  outcome: ScoredAnswer["outcome"],
): ScoredAnswer => ({ severity, outcome });

describe("verdict", () => {
  it("when a critical item fails, then not ready, whatever else passes", () => {
    expect(
      verdictOf([answer("critical", "fail"), answer("major", "pass"), answer("minor", "pass")]),
    ).toBe("not_ready");
  });

  it("when only major or minor items fail, then ready with conditions", () => {
    expect(verdictOf([answer("critical", "pass"), answer("minor", "fail")])).toBe(
      "ready_with_conditions",
    );
    expect(verdictOf([answer("major", "fail")])).toBe("ready_with_conditions");
  });

  it("when nothing fails, then ready; not applicable does not fail", () => {
    expect(verdictOf([answer("critical", "pass"), answer("major", "not_applicable")])).toBe(
      "ready",
    );
  });
});

describe("score", () => {
  it("when weights are critical 5, major 3, minor 1, then the pass rate weighs them", () => {
    // pass: critical (5) + minor (1) = 6; applicable: 5 + 3 + 1 = 9.
    expect(
      scoreOf([answer("critical", "pass"), answer("major", "fail"), answer("minor", "pass")]),
    ).toBeCloseTo(6 / 9, 15);
  });

  it("when items do not apply, then they leave the denominator", () => {
    expect(scoreOf([answer("critical", "pass"), answer("major", "not_applicable")])).toBe(1);
  });

  it("when no item applies, then there is no score", () => {
    expect(scoreOf([answer("minor", "not_applicable")])).toBeNull();
    expect(scoreOf([])).toBeNull();
  });
});
