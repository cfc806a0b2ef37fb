import { sql } from "drizzle-orm";
import {
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  timestamp,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { images } from "./images";
import { retirementColumns } from "./retirement";
import { sites } from "./sites";

export const zoneTypeEnum = pgEnum("zone_type", [
  "isolation_room",
  "anteroom",
  "donning_zone",
  "doffing_area",
]);
export const constructionClassEnum = pgEnum("construction_class", ["new_or_renovated", "existing"]);
export const fixtureKindEnum = pgEnum("fixture_kind", [
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
]);

/**
 * A floor of a building at a site. Its coordinate space is fixed by the first plan uploaded
 * (plan_width × plan_height units); a replacement plan is shown in the same space, so what was
 * placed keeps its position.
 */
export const floors = pgTable(
  "floors",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    building: varchar("building", { length: 80 }).notNull(),
    level: integer("level").notNull(),
    name: varchar("name", { length: 80 }).notNull(),
    planImageId: uuid("plan_image_id").references(() => images.id, { onDelete: "set null" }),
    planWidth: doublePrecision("plan_width"),
    planHeight: doublePrecision("plan_height"),
    metresPerUnit: doublePrecision("metres_per_unit"),
    /** The two points and distance the scale came from, to show and re-check it. */
    scaleReference: jsonb("scale_reference").$type<{
      a: { x: number; y: number };
      b: { x: number; y: number };
      distanceMetres: number;
    }>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    ...retirementColumns(),
  },
  (table) => [index("floors_site_idx").on(table.siteId)],
);

/** A room with its anteroom, donning zone and doffing area: the spaces that belong together. */
export const suites = pgTable("suites", {
  id: uuid("id").primaryKey().defaultRandom(),
  floorId: uuid("floor_id")
    .notNull()
    .references(() => floors.id, { onDelete: "cascade" }),
  name: varchar("name", { length: 80 }).notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const spaces = pgTable(
  "spaces",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    floorId: uuid("floor_id")
      .notNull()
      .references(() => floors.id, { onDelete: "cascade" }),
    /** Copied from the floor so every read and write can be scoped to a site in one step. */
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    zoneType: zoneTypeEnum("zone_type").notNull(),
    name: varchar("name", { length: 80 }).notNull(),
    number: varchar("number", { length: 20 }),
    polygon: jsonb("polygon").$type<[number, number][]>().notNull(),
    suiteId: uuid("suite_id").references(() => suites.id, { onDelete: "set null" }),
    constructionClass: constructionClassEnum("construction_class"),
    volumeM3: doublePrecision("volume_m3"),
    floorAreaM2: doublePrecision("floor_area_m2"),
    ceilingHeightM: doublePrecision("ceiling_height_m"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    ...retirementColumns(),
  },
  (table) => [
    index("spaces_floor_idx").on(table.floorId),
    check(
      "spaces_positive_measures",
      sql`coalesce(${table.volumeM3}, 1) > 0 and coalesce(${table.floorAreaM2}, 1) > 0 and coalesce(${table.ceilingHeightM}, 1) > 0`,
    ),
  ],
);

export const fixtures = pgTable(
  "fixtures",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "cascade" }),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    kind: fixtureKindEnum("kind").notNull(),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    label: varchar("label", { length: 80 }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index("fixtures_space_idx").on(table.spaceId)],
);
