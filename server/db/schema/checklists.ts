import { sql } from "drizzle-orm";
import {
  boolean,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { zoneTypeEnum } from "./floors";
import { networks } from "./networks";
import { users } from "./users";

export const severityEnum = pgEnum("severity", ["critical", "major", "minor"]);
export const responseKindEnum = pgEnum("response_kind", ["check", "reading", "count", "choice"]);
export const checklistStatusEnum = pgEnum("checklist_status", ["draft", "published"]);

/**
 * One version of a zone type's checklist for a network. Published versions never change; an
 * audit keeps the version it started with. At most one draft per zone type is being edited.
 */
export const checklistVersions = pgTable(
  "checklist_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    networkId: uuid("network_id")
      .notNull()
      .references(() => networks.id, { onDelete: "cascade" }),
    zoneType: zoneTypeEnum("zone_type").notNull(),
    version: integer("version").notNull(),
    status: checklistStatusEnum("status").notNull(),
    title: varchar("title", { length: 120 }).notNull(),
    publishedAt: timestamp("published_at", { withTimezone: true }),
    publishedBy: uuid("published_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("checklist_versions_number_unique").on(table.networkId, table.zoneType, table.version),
    uniqueIndex("checklist_versions_one_draft")
      .on(table.networkId, table.zoneType)
      .where(sql`status = 'draft'`),
  ],
);

export const checklistItems = pgTable(
  "checklist_items",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => checklistVersions.id, { onDelete: "cascade" }),
    /** Stable across versions. */
    key: varchar("key", { length: 60 }).notNull(),
    position: integer("position").notNull(),
    text: varchar("text", { length: 300 }).notNull(),
    severity: severityEnum("severity").notNull(),
    response: responseKindEnum("response").notNull(),
    quantity: text("quantity"),
    thresholdOp: text("threshold_op"),
    thresholdValue: doublePrecision("threshold_value"),
    choices: jsonb("choices").$type<{ value: string; label: string; passes: boolean }[]>(),
    reference: varchar("reference", { length: 300 }),
    photoOnFail: boolean("photo_on_fail").notNull().default(false),
  },
  (table) => [
    index("checklist_items_version_idx").on(table.versionId, table.position),
    unique("checklist_items_key_unique").on(table.versionId, table.key),
  ],
);
