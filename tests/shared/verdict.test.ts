import { describe, expect, it } from "vitest";

import {
  airflowNotConfirmedReason,
  type JudgedAnswer,
  readinessOf,
  rulesVersion,
  scoreOf,
  type ScoredAnswer,
} from "@shared/calc/verdict";

// Lintel's own rules (not a published standard): see shared/calc/verdict.ts.
const answer = (
  severity: ScoredAnswer["severity"],
  outcome: ScoredAnswer["outcome"],
  key = `item.${severity}`,
): JudgedAnswer => ({ key, text: `The ${severity} item`, severity, outcome });

const pressure = (outcome: ScoredAnswer["outcome"]) => answer("critical", outcome, "room.pressure");
// The default checklist's visual test is major; the rule treats its failure as critical anyway.
const smoke = (outcome: ScoredAnswer["outcome"]) => answer("major", outcome, "room.smoke-test");

describe("verdict (Lintel's own rules, version 2)", () => {
  it("when the rules are version 2, then stored verdicts record 2", () => {
    expect(rulesVersion).toBe(2);
  });

  it("when a critical item fails, then hold until fixed, naming the item, whatever else passes", () => {
    expect(
      readinessOf("doffing_area", [
        answer("critical", "fail"),
        answer("major", "pass"),
        answer("minor", "pass"),
      ]),
    ).toEqual({ verdict: "hold", reasons: ["Critical item failed: The critical item"] });
  });

  it("when only major or minor items fail, then gaps to fix, naming each", () => {
    expect(readinessOf("anteroom", [answer("critical", "pass"), answer("minor", "fail")])).toEqual({
      verdict: "gaps_to_fix",
      reasons: ["Minor item failed: The minor item"],
    });
    expect(readinessOf("anteroom", [answer("major", "fail")]).verdict).toBe("gaps_to_fix");
  });

  it("when nothing fails outside an isolation room, then ready; not applicable does not fail", () => {
    expect(
      readinessOf("donning_zone", [answer("critical", "pass"), answer("major", "not_applicable")]),
    ).toEqual({ verdict: "all_clear", reasons: [] });
  });

  // Lintel's own rule, on top of CDC 2005 TB guidelines, MMWR 54(RR-17): check negative pressure
  // (smoke tube or monitor) before occupancy and daily while occupied (clause from memory).
  it("when an isolation room's pressure and visual test are both not applicable, then hold until fixed: inward airflow not confirmed", () => {
    expect(
      readinessOf("isolation_room", [
        pressure("not_applicable"),
        smoke("not_applicable"),
        answer("critical", "pass"),
        answer("major", "pass"),
      ]),
    ).toEqual({ verdict: "hold", reasons: [airflowNotConfirmedReason] });
    expect(airflowNotConfirmedReason).toMatch(/^Inward airflow not confirmed/);
  });

  it("when an isolation room's checklist has neither airflow item, then hold until fixed: inward airflow not confirmed", () => {
    expect(readinessOf("isolation_room", [answer("critical", "pass")]).reasons).toEqual([
      airflowNotConfirmedReason,
    ]);
  });

  it("when the pressure reading passes or the visual test passes, then inward airflow is confirmed", () => {
    expect(readinessOf("isolation_room", [pressure("pass"), smoke("not_applicable")])).toEqual({
      verdict: "all_clear",
      reasons: [],
    });
    expect(readinessOf("isolation_room", [pressure("not_applicable"), smoke("pass")])).toEqual({
      verdict: "all_clear",
      reasons: [],
    });
  });

  // Lintel's own rule: a visual test showing air leaving the room is critical, whatever the
  // severity the checklist gives the item.
  it("when the visual (smoke) test fails, then hold until fixed even though the pressure reading passes", () => {
    const result = readinessOf("isolation_room", [pressure("pass"), smoke("fail")]);
    expect(result.verdict).toBe("hold");
    expect(result.reasons).toEqual([
      "Visual (smoke) test failed, which is always critical: The major item",
    ]);
  });

  it("when the pressure reading fails and the visual test is not applicable, then both reasons are given", () => {
    expect(readinessOf("isolation_room", [pressure("fail"), smoke("not_applicable")])).toEqual({
      verdict: "hold",
      reasons: ["Critical item failed: The critical item", airflowNotConfirmedReason],
    });
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
