import { date, integer, pgTable, primaryKey, uuid, varchar } from "drizzle-orm/pg-core";

import { zoneTypeEnum } from "./floors";
import { sites } from "./sites";

/**
 * Monthly totals of submitted audits, kept in the transaction of each submit and amendment, so
 * the committee's comparisons and trends read a few thousand rows instead of every answer.
 * `month` is the first day of the month on the site's own clock.
 */
export const auditMonthStats = pgTable(
  "audit_month_stats",
  {
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    zoneType: zoneTypeEnum("zone_type").notNull(),
    month: date("month", { mode: "string" }).notNull(),
    audits: integer("audits").notNull().default(0),
    allClear: integer("all_clear").notNull().default(0),
    gapsToFix: integer("gaps_to_fix").notNull().default(0),
    hold: integer("hold").notNull().default(0),
  },
  (table) => [primaryKey({ columns: [table.siteId, table.zoneType, table.month] })],
);

/** Monthly answers that applied and passed, by item group (shared/checklists/categories.ts). */
export const answerMonthStats = pgTable(
  "answer_month_stats",
  {
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    zoneType: zoneTypeEnum("zone_type").notNull(),
    month: date("month", { mode: "string" }).notNull(),
    category: varchar("category", { length: 30 }).notNull(),
    applicable: integer("applicable").notNull().default(0),
    passed: integer("passed").notNull().default(0),
  },
  (table) => [primaryKey({ columns: [table.siteId, table.zoneType, table.month, table.category] })],
);

/** The item groups as the database sees them, written from the shared list at start-up. */
export const itemCategoryKeys = pgTable("item_category_keys", {
  key: varchar("key", { length: 60 }).primaryKey(),
  category: varchar("category", { length: 30 }).notNull(),
});
