import {
  doublePrecision,
  pgTable,
  text,
  timestamp,
  unique,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { networks } from "./networks";
import { retirementColumns } from "./retirement";

export const sites = pgTable(
  "sites",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    networkId: uuid("network_id")
      .notNull()
      .references(() => networks.id),
    name: varchar("name", { length: 120 }).notNull(),
    address: varchar("address", { length: 300 }).notNull(),
    /** IANA zone name, validated on input; due times are computed in it. */
    timeZone: text("time_zone").notNull(),
    latitude: doublePrecision("latitude").notNull(),
    longitude: doublePrecision("longitude").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    ...retirementColumns(),
  },
  (table) => [unique("sites_network_name_unique").on(table.networkId, table.name)],
);
