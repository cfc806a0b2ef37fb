import type { Fixture, Floor, FloorDetail, Space, Suite } from "@shared/schemas/floors";

import { tamsinGeneral } from "./api-stub";

export const floorId = "6b1c8a52-9d0e-4f1a-8b23-4c5d6e7f8091";

/** A floor of Tamsin Bay General; plan 1200 × 800 units, 0.025 m a unit once scaled. */
export function buildFloor(overrides: Partial<Floor> = {}): Floor {
  return {
    id: floorId,
    siteId: tamsinGeneral.id,
    building: "Main block",
    level: 4,
    name: "Ward 4 East",
    plan: { imageId: "7c2d9b63-0e1f-4a2b-9c34-5d6e7f809102", width: 1200, height: 800 },
    metresPerUnit: 0.025,
    scaleReference: { a: { x: 100, y: 760 }, b: { x: 300, y: 760 }, distanceMetres: 5 },
    ...overrides,
  };
}

export const suite4: Suite = {
  id: "8d3eac74-1f20-4b3c-8d45-6e7f8091a213",
  floorId,
  name: "Suite 4",
};

export function buildSpace(overrides: Partial<Space> = {}): Space {
  return {
    id: "9e4fbd85-2031-4c4d-9e56-7f8091a2b324",
    floorId,
    zoneType: "doffing_area",
    name: "Doffing area",
    number: "4",
    polygon: [
      [820, 70],
      [1130, 70],
      [1130, 380],
      [820, 380],
    ],
    suiteId: suite4.id,
    constructionClass: null,
    volumeM3: null,
    floorAreaM2: null,
    ceilingHeightM: null,
    ...overrides,
  };
}

export function buildFixture(overrides: Partial<Fixture> = {}): Fixture {
  return {
    id: "af50ce96-3142-4d5e-8f67-8091a2b3c435",
    spaceId: buildSpace().id,
    kind: "hand_rub_station",
    x: 1000,
    y: 300,
    label: null,
    ...overrides,
  };
}

export function buildFloorDetail(overrides: Partial<FloorDetail> = {}): FloorDetail {
  return {
    floor: buildFloor(),
    suites: [suite4],
    spaces: [buildSpace()],
    fixtures: [],
    ...overrides,
  };
}
