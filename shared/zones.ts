/** Zone types of the spaces an audit covers (trade terms). */
export const zoneTypes = ["isolation_room", "anteroom", "donning_zone", "doffing_area"] as const;
export type ZoneType = (typeof zoneTypes)[number];

export const zoneTypeLabels: Record<ZoneType, string> = {
  isolation_room: "Isolation room",
  anteroom: "Anteroom",
  donning_zone: "Donning zone",
  doffing_area: "Doffing area",
};

/** Decides the air-change threshold later: new or renovated rooms need more than existing ones. */
export const constructionClasses = ["new_or_renovated", "existing"] as const;
export type ConstructionClass = (typeof constructionClasses)[number];

export const constructionClassLabels: Record<ConstructionClass, string> = {
  new_or_renovated: "New or renovated",
  existing: "Existing",
};

export const fixtureKinds = [
  "hand_rub_station",
  "clean_chair",
  "dirty_chair",
  "hands_free_bin",
  "mirror",
  "glove_supply",
  "wipes",
  "ppe_stock",
  "pressure_monitor",
  "signage",
] as const;
export type FixtureKind = (typeof fixtureKinds)[number];

export const fixtureKindLabels: Record<FixtureKind, string> = {
  hand_rub_station: "Hand-rub station",
  clean_chair: "Clean chair",
  dirty_chair: "Dirty chair",
  hands_free_bin: "Hands-free bin",
  mirror: "Mirror",
  glove_supply: "Glove supply",
  wipes: "Disinfectant wipes",
  ppe_stock: "PPE stock",
  pressure_monitor: "Pressure monitor",
  signage: "Signage",
};
