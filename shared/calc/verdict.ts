/**
 * Lintel's own readiness rules (not a published standard): see `readinessOf`.
 * Score = weighted pass rate over the items that apply (critical 5, major 3, minor 1).
 */
export const severities = ["critical", "major", "minor"] as const;
export type Severity = (typeof severities)[number];

export const severityWeights: Record<Severity, number> = { critical: 5, major: 3, minor: 1 };

/**
 * A space's verdict after an audit, worst first, named after what the team does next:
 *   hold         a critical item failed (or an isolation room's inward airflow was not
 *                confirmed): hold the space until it is fixed
 *   gaps_to_fix  only major or minor items failed: corrective actions are raised for the gaps
 *   all_clear    nothing failed
 */
export const verdicts = ["hold", "gaps_to_fix", "all_clear"] as const;
export type Verdict = (typeof verdicts)[number];

export const verdictLabels: Record<Verdict, string> = {
  hold: "Hold until fixed",
  gaps_to_fix: "Gaps to fix",
  all_clear: "All clear",
};

/** One sentence on each verdict, for keys and hints. */
export const verdictHints: Record<Verdict, string> = {
  hold: "A critical item failed, or an isolation room's inward airflow was not confirmed.",
  gaps_to_fix: "Only major or minor items failed; each gap has a corrective action.",
  all_clear: "Every item that applies passed.",
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

/** Severities in words for people (screens, e-mails, CSV cells, the PDF). */
export const severityLabels: Record<Severity, string> = {
  critical: "Critical",
  major: "Major",
  minor: "Minor",
};

/**
 * Lintel's own readiness rules (version 2), on top of the cited sources:
 * - any critical item failed → hold until fixed; a failed visual (smoke) test counts as critical;
 * - an isolation room whose inward airflow was not confirmed in this audit (the pressure item
 *   passed its threshold, or the visual test passed) → hold until fixed;
 * - otherwise any failed item → gaps to fix; else all clear.
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
  if (reasons.length > 0) return { verdict: "hold", reasons };
  const others = failed.map((a) => `${severityLabels[a.severity]} item failed: ${a.text}`);
  if (others.length > 0) return { verdict: "gaps_to_fix", reasons: others };
  return { verdict: "all_clear", reasons: [] };
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
