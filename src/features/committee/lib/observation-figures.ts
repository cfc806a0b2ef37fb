import type { ObservationCommitteeResponse } from "@shared/schemas/observations";

export type ObservationFigures = ObservationCommitteeResponse["network"];
export type StepBreachRate = ObservationFigures["steps"][number];

/** A sequence's key as words: "standard-removal-1" → "Standard removal 1". */
export function sequenceName(key: string): string {
  const words = key.replace(/-+/g, " ").trim();
  return words ? `${words[0]!.toUpperCase()}${words.slice(1)}` : key;
}

/** The steps grouped by their sequence, in the order the server sent them. */
export function stepsBySequence(
  steps: readonly StepBreachRate[],
): { sequenceKey: string; steps: StepBreachRate[] }[] {
  const groups = new Map<string, StepBreachRate[]>();
  for (const step of steps) {
    const group = groups.get(step.sequenceKey);
    if (group) group.push(step);
    else groups.set(step.sequenceKey, [step]);
  }
  return [...groups].map(([sequenceKey, grouped]) => ({ sequenceKey, steps: grouped }));
}

/** Why a cell is empty: too few staff members to describe without pointing to one of them. */
export function suppressionText(minimumStaffCodes: number): string {
  return `Not shown: fewer than ${minimumStaffCodes} staff members observed in this period, so the figures could point to a person.`;
}

/** Whose figures the committee is reading: the network's, or one site's. */
export type FiguresChoice = { kind: "network" } | { kind: "site"; siteId: string };

export function figuresFor(
  response: ObservationCommitteeResponse,
  choice: FiguresChoice,
): { name: string; figures: ObservationFigures } | null {
  if (choice.kind === "network") return { name: "All sites together", figures: response.network };
  const site = response.sites.find((candidate) => candidate.siteId === choice.siteId);
  return site ? { name: site.siteName, figures: site } : null;
}
