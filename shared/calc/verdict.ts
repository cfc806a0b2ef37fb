/**
 * Lintel's own readiness rules (not a published standard):
 * - not ready when any critical item fails; ready with conditions when any major or minor item
 *   fails; ready otherwise;
 * - score = weighted pass rate over the items that apply (critical 5, major 3, minor 1).
 */
export const severities = ["critical", "major", "minor"] as const;
export type Severity = (typeof severities)[number];

export const severityWeights: Record<Severity, number> = { critical: 5, major: 3, minor: 1 };

export const verdicts = ["not_ready", "ready_with_conditions", "ready"] as const;
export type Verdict = (typeof verdicts)[number];

export const verdictLabels: Record<Verdict, string> = {
  not_ready: "Not ready",
  ready_with_conditions: "Ready with conditions",
  ready: "Ready",
};

export type Outcome = "pass" | "fail" | "not_applicable";

export interface ScoredAnswer {
  severity: Severity;
  outcome: Outcome;
}

export function verdictOf(answers: readonly ScoredAnswer[]): Verdict {
  if (answers.some((a) => a.outcome === "fail" && a.severity === "critical")) return "not_ready";
  if (answers.some((a) => a.outcome === "fail")) return "ready_with_conditions";
  return "ready";
}

/** Weighted pass rate in [0, 1]; null when no item applies. */
export function scoreOf(answers: readonly ScoredAnswer[]): number | null {
  let applicable = 0;
  let passed = 0;
  for (const answer of answers) {
    if (answer.outcome === "not_applicable") continue;
    const weight = severityWeights[answer.severity];
    applicable += weight;
    if (answer.outcome === "pass") passed += weight;
  }
  return applicable === 0 ? null : passed / applicable;
}
