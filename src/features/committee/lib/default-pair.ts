import type { ComparisonResponse } from "@shared/schemas/committee";

/**
 * The two sites compared when the address names none: the first two with audits in the period,
 * topped up with the first sites at all when fewer than two have any.
 */
export function defaultPair(
  comparison: ComparisonResponse,
): { siteA: string; siteB: string } | null {
  const withData = comparison.sites.filter((site) => site.readiness.n > 0);
  const rest = comparison.sites.filter((site) => site.readiness.n === 0);
  const [first, second] = [...withData, ...rest];
  return first && second ? { siteA: first.siteId, siteB: second.siteId } : null;
}
