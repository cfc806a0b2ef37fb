import { describe, expect, it } from "vitest";

import { defaultChecklists } from "@shared/checklists/defaults";
import {
  itemKeyForSpaceProblem,
  spaceProblemItemKeys,
} from "@shared/observations/space-problem-items";
import { observedZoneTypes } from "@shared/schemas/observations";

describe("which checklist item a space-caused breach is a finding against", () => {
  it("when a problem maps to an item, then that item is in the default checklist of that kind of space", () => {
    for (const zoneType of observedZoneTypes) {
      const keys = defaultChecklists[zoneType].items.map((item) => item.key);
      for (const key of Object.values(spaceProblemItemKeys[zoneType])) expect(keys).toContain(key);
    }
  });

  it("when a doffing area lacks hand rub, has a full bin or no clean/dirty line, then the findings are hand rub within reach, bins not past three-quarters (common practice) and the floor line", () => {
    expect(itemKeyForSpaceProblem("doffing_area", "no_hand_rub_within_reach")).toBe(
      "doff.hand-rub-reach",
    );
    expect(itemKeyForSpaceProblem("doffing_area", "bin_full")).toBe("doff.bins-fill");
    expect(itemKeyForSpaceProblem("doffing_area", "no_clean_dirty_separation")).toBe(
      "doff.clean-dirty-line",
    );
  });

  it("when a kind of space has no matching item, or is not observed at all, then there is no finding", () => {
    expect(itemKeyForSpaceProblem("anteroom", "bin_full")).toBeNull();
    expect(itemKeyForSpaceProblem("donning_zone", "bin_full")).toBeNull();
    expect(itemKeyForSpaceProblem("isolation_room", "no_hand_rub_within_reach")).toBeNull();
  });
});
