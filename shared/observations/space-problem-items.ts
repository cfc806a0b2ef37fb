import type { PrecheckKey, SpaceProblem } from "../schemas/observations";
import { observedZoneTypes } from "../schemas/observations";

type ObservedZoneType = (typeof observedZoneTypes)[number];

/**
 * The checklist item of each observed kind of space that a space-caused breach is a finding
 * against (keys of `shared/checklists/defaults.ts`). A problem with no matching item in a kind of
 * space (a bin in an anteroom's checklist, say) stays a breach and opens nothing.
 */
export const spaceProblemItemKeys: Record<
  ObservedZoneType,
  Partial<Record<SpaceProblem, string>>
> = {
  donning_zone: {
    no_hand_rub_within_reach: "don.hand-rub-present",
    // Used PPE or waste in the clean zone is the donning zone's side of a missing separation.
    no_clean_dirty_separation: "don.no-used-items",
  },
  doffing_area: {
    no_hand_rub_within_reach: "doff.hand-rub-reach",
    bin_full: "doff.bins-fill",
    no_clean_dirty_separation: "doff.clean-dirty-line",
  },
  anteroom: {
    no_hand_rub_within_reach: "ante.hand-rub",
  },
};

export function itemKeyForSpaceProblem(zoneType: string, problem: SpaceProblem): string | null {
  if (!(observedZoneTypes as readonly string[]).includes(zoneType)) return null;
  return spaceProblemItemKeys[zoneType as ObservedZoneType][problem] ?? null;
}

/**
 * The area check before an observation asks about the same things a space-caused breach names:
 * a failed check is a finding against the same checklist item of the space.
 */
export const precheckProblems: Record<PrecheckKey, SpaceProblem> = {
  waste_not_overfull: "bin_full",
  hand_rub_within_reach: "no_hand_rub_within_reach",
  sides_marked: "no_clean_dirty_separation",
};
