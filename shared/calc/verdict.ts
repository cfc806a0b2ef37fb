/**
 * Lintel's own readiness rules (not a published standard): see `readinessOf`.
 * Score = weighted pass rate over the items that apply (critical 5, major 3, minor 1).
 */
export const severities = ["critical", "major", "minor"] as const;
export type Severity = (typeof severities)[number];

/** Severity as people read it, in screens and in every export cell. */
export const severityLabels: Record<Severity, string> = {
  critical: "Critical",
  major: "Major",
  minor: "Minor",
};

export const severityWeights: Record<Severity, number> = { critical: 5, major: 3, minor: 1 };

export const verdicts = ["not_ready", "ready_with_conditions", "ready"] as const;
export type Verdict = (typeof verdicts)[number];

export const verdictLabels: Record<Verdict, string> = {
  not_ready: "Hold until fixed",
  ready_with_conditions: "Gaps to fix",
  ready: "All clear",
};

export type Outcome = "pass" | "fail" | "not_applicable";

export interface ScoredAnswer {
  severity: Severity;
  outcome: Outcome;
}

/**
 * The version of the readiness rules below. A stored verdict records the version that decided it.
 * 1: critical failures only. 2: an isolation room also needs inward airflow confirmed, and a failed
 * visual (smoke) test is critical whatever the item's severity.
 */
export const rulesVersion = 2;

/** Item keys the airflow rule reads; they stay stable across checklist versions. */
export const pressureItemKey = "room.pressure";
export const smokeTestItemKey = "room.smoke-test";

export interface JudgedAnswer extends ScoredAnswer {
  key: string;
  /** The item's words, to name it in a reason. */
  text: string;
}

export interface Readiness {
  verdict: Verdict;
  /** Why, in words, item by item; empty when every item that applies passed. */
  reasons: string[];
}

export const airflowNotConfirmedReason =
  "Inward airflow not confirmed: neither a pressure reading meeting the threshold nor a passing visual (smoke) test in this audit.";

const severityWords: Record<Severity, string> = {
  critical: "Critical",
  major: "Major",
  minor: "Minor",
};

/**
 * Lintel's own readiness rules (version 2), on top of the cited sources:
 * - any critical item failed → not ready; a failed visual (smoke) test counts as critical;
 * - an isolation room whose inward airflow was not confirmed in this audit (the pressure item
 *   passed its threshold, or the visual test passed) → not ready;
 * - otherwise any failed item → ready with conditions; else ready.
 */
export function readinessOf(zoneType: string, answers: readonly JudgedAnswer[]): Readiness {
  const critical = (a: JudgedAnswer) => a.severity === "critical" || a.key === smokeTestItemKey;
  const failed = answers.filter((a) => a.outcome === "fail");
  const criticalFailed = failed.filter(critical);
  const reasons = criticalFailed.map((a) =>
    a.severity === "critical"
      ? `Critical item failed: ${a.text}`
      : `Visual (smoke) test failed, which is always critical: ${a.text}`,
  );
  if (zoneType === "isolation_room") {
    const confirmed = answers.some(
      (a) => (a.key === pressureItemKey || a.key === smokeTestItemKey) && a.outcome === "pass",
    );
    if (!confirmed) reasons.push(airflowNotConfirmedReason);
  }
  if (reasons.length > 0) return { verdict: "not_ready", reasons };
  const others = failed.map((a) => `${severityWords[a.severity]} item failed: ${a.text}`);
  if (others.length > 0) return { verdict: "ready_with_conditions", reasons: others };
  return { verdict: "ready", reasons: [] };
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
