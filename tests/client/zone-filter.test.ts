import { describe, expect, it } from "vitest";

import {
  applyZoneFilter,
  setZoneVisible,
  showAllZones,
} from "@/features/floor-plans/lib/zone-filter";

import { buildFixture, buildSpace } from "./support/floor-data";

const room = buildSpace({ id: "s-room", zoneType: "isolation_room", name: "Room 4" });
const doffing = buildSpace({ id: "s-doff", zoneType: "doffing_area", name: "Doffing area" });
const chair = buildFixture({ id: "f-chair", spaceId: doffing.id, kind: "dirty_chair" });
const monitor = buildFixture({ id: "f-monitor", spaceId: room.id, kind: "pressure_monitor" });
const content = { spaces: [room, doffing], fixtures: [chair, monitor] };

describe("zone type filters", () => {
  it("when nothing is filtered, then every space and fixture is shown", () => {
    expect(applyZoneFilter(content, showAllZones())).toEqual(content);
  });

  it("when doffing areas are hidden, then their spaces and the fixtures in them are hidden too", () => {
    const filter = setZoneVisible(showAllZones(), "doffing_area", false);

    const shown = applyZoneFilter(content, filter);

    expect(shown.spaces.map((space) => space.id)).toEqual(["s-room"]);
    expect(shown.fixtures.map((fixture) => fixture.id)).toEqual(["f-monitor"]);
  });

  it("when a hidden zone type is shown again, then its spaces come back", () => {
    const hidden = setZoneVisible(showAllZones(), "doffing_area", false);
    const shownAgain = setZoneVisible(hidden, "doffing_area", true);

    expect(applyZoneFilter(content, shownAgain)).toEqual(content);
  });

  it("when a filter changes, then the earlier filter is left as it was", () => {
    const all = showAllZones();
    setZoneVisible(all, "isolation_room", false);
    expect(all.has("isolation_room")).toBe(true);
  });

  it("when every zone type is hidden, then nothing is shown", () => {
    let filter = showAllZones();
    for (const zone of ["isolation_room", "anteroom", "donning_zone", "doffing_area"] as const) {
      filter = setZoneVisible(filter, zone, false);
    }
    expect(applyZoneFilter(content, filter)).toEqual({ spaces: [], fixtures: [] });
  });
});
