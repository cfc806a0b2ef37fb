/**
 * Lintel's own grouping of checklist items, for comparing compliance by subject. Items an
 * administrator adds later fall under "other" until they are given a group here.
 */
export const itemCategories = [
  "ppe_supply",
  "hand_hygiene",
  "layout",
  "guidance",
  "air_and_doors",
  "other",
] as const;
export type ItemCategory = (typeof itemCategories)[number];

export const itemCategoryLabels: Record<ItemCategory, string> = {
  ppe_supply: "PPE supply",
  hand_hygiene: "Hand hygiene",
  layout: "Layout and separation",
  guidance: "Posters and signs",
  air_and_doors: "Air and doors",
  other: "Other items",
};

const byKey: Record<string, ItemCategory> = {
  "don.ppe-stock": "ppe_supply",
  "don.respirator-sizes": "ppe_supply",
  "doff.spare-gloves": "ppe_supply",
  "doff.wipes": "ppe_supply",
  "don.hand-rub-present": "hand_hygiene",
  "don.hand-rub-expiry": "hand_hygiene",
  "don.hand-rub-alcohol": "hand_hygiene",
  "doff.hand-rub-reach": "hand_hygiene",
  "doff.hand-rub-stations": "hand_hygiene",
  "doff.dispenser-spacing": "hand_hygiene",
  "doff.hand-hygiene-after": "hand_hygiene",
  "ante.hand-rub": "hand_hygiene",
  "don.clean-chair": "layout",
  "don.mirror-or-observer": "layout",
  "don.integrity-check": "layout",
  "don.no-used-items": "layout",
  "don.clear-floor": "layout",
  "doff.separate": "layout",
  "doff.dirty-chair": "layout",
  "doff.no-clean-chair-mixed": "layout",
  "doff.clean-chair-clean-side": "layout",
  "doff.bins-hands-free": "layout",
  "doff.bins-fill": "layout",
  "doff.mirror-or-observer": "layout",
  "doff.no-clean-supplies": "layout",
  "doff.floor-clear": "layout",
  "don.order-poster": "guidance",
  "don.seal-check-guide": "guidance",
  "doff.order-poster": "guidance",
  "doff.respirator-last": "guidance",
  "room.signage": "guidance",
  "ante.signage": "guidance",
  "room.pressure": "air_and_doors",
  "room.airflow": "air_and_doors",
  "room.air-changes": "air_and_doors",
  "room.door-closed": "air_and_doors",
  "room.monitor-alarm": "air_and_doors",
  "room.smoke-test": "air_and_doors",
  "ante.pressure": "air_and_doors",
  "ante.doors-not-both-open": "air_and_doors",
  "ante.door-closers": "air_and_doors",
  "don.fit-test-records": "ppe_supply",
  "room.respirators-at-door": "ppe_supply",
  "don.hand-rub-alcohol-max": "hand_hygiene",
  "don.dispenser-ignition": "hand_hygiene",
  "don.dispenser-volume": "hand_hygiene",
  "doff.dispenser-ignition": "hand_hygiene",
  "doff.dispenser-volume": "hand_hygiene",
  "doff.sink": "hand_hygiene",
  "room.hand-rub-entry-exit": "hand_hygiene",
  "don.corridor-width": "layout",
  "doff.clean-dirty-line": "layout",
  "doff.eye-protection-container": "layout",
  "room.bin-by-exit": "layout",
  "room.monitor-present": "air_and_doors",
  "room.pressure-log": "air_and_doors",
  "room.self-closer": "air_and_doors",
  "room.clearance-time": "air_and_doors",
  "ante.room-direction": "air_and_doors",
};

export function categoryOfItem(key: string): ItemCategory {
  return byKey[key] ?? "other";
}

/** Every grouped key with its group, for SQL that groups answers the same way. */
export const categorisedKeys: readonly (readonly [string, ItemCategory])[] = Object.entries(byKey);
