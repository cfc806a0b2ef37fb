import type { ObservationCommitteeResponse } from "@shared/schemas/observations";

export type ObservationFigures = ObservationCommitteeResponse["network"];
export type StepBreachRate = ObservationFigures["steps"][number];

/** The steps grouped by their sequence, in the order the server sent them. */
export function stepsBySequence(
  steps: readonly StepBreachRate[],
): { sequenceKey: string; sequenceTitle: string; steps: StepBreachRate[] }[] {
  const groups = new Map<string, StepBreachRate[]>();
  for (const step of steps) {
    const group = groups.get(step.sequenceKey);
    if (group) group.push(step);
    else groups.set(step.sequenceKey, [step]);
  }
  return [...groups].map(([sequenceKey, grouped]) => ({
    sequenceKey,
    sequenceTitle: grouped[0]!.sequenceTitle,
    steps: grouped,
  }));
}

/** Why a whole block is empty: too few staff members to describe without pointing to one. */
export function suppressionText(minimumStaffCodes: number): string {
  return `Not shown: fewer than ${minimumStaffCodes} staff members observed in this period, so the figures could point to a person.`;
}

/** Why one cell is empty, short enough for a table. */
export function suppressedCellText(minimumStaffCodes: number): string {
  return `Not shown: fewer than ${minimumStaffCodes} staff members observed`;
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
