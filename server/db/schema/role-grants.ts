import { sql } from "drizzle-orm";
import { check, index, pgEnum, pgTable, timestamp, unique, uuid } from "drizzle-orm/pg-core";

import { sites } from "./sites";
import { users } from "./users";

export const roleEnum = pgEnum("role", [
  "administrator",
  "auditor",
  "facilities_lead",
  "committee_member",
]);

/** Person × role × site. An empty site means network-wide, allowed for two roles only. */
export const roleGrants = pgTable(
  "role_grants",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
    siteId: uuid("site_id").references(() => sites.id, { onDelete: "cascade" }),
    grantedBy: uuid("granted_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("role_grants_unique").on(table.userId, table.role, table.siteId).nullsNotDistinct(),
    index("role_grants_site_idx").on(table.siteId),
    check(
      "role_grants_network_wide_roles",
      sql`${table.siteId} is not null or ${table.role} in ('administrator', 'committee_member')`,
    ),
  ],
);
