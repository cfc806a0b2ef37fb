import { and, eq, sql, type SQL } from "drizzle-orm";
import { boolean, pgTable, text, timestamp, uniqueIndex, uuid, varchar } from "drizzle-orm/pg-core";

import { networks } from "./networks";

export const users = pgTable(
  "users",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    networkId: uuid("network_id")
      .notNull()
      .references(() => networks.id),
    /** Stored trimmed and lower-cased; unique regardless of case. */
    email: varchar("email", { length: 254 }).notNull(),
    displayName: varchar("display_name", { length: 120 }).notNull(),
    /** Null until the person sets a password (invited, not yet joined). */
    passwordHash: text("password_hash"),
    deactivatedAt: timestamp("deactivated_at", { withTimezone: true }),
    /**
     * The address belongs to an account in another network. This row only keeps the inviting
     * network's invitation in its own list: it never signs in, never accepts a link and never
     * resets a password (docs/decisions/0007-invitations-to-addresses-known-elsewhere.md).
     */
    heldElsewhere: boolean("held_elsewhere").notNull().default(false),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    // One account per address across every network; placeholders are unique per network.
    uniqueIndex("users_email_unique")
      .on(sql`lower(${table.email})`)
      .where(sql`not ${table.heldElsewhere}`),
    uniqueIndex("users_network_email_unique").on(table.networkId, sql`lower(${table.email})`),
  ],
);

/** The account that holds an address (never another network's placeholder for it). */
export function accountWithAddress(email: string): SQL {
  return and(eq(sql`lower(${users.email})`, email.toLowerCase()), eq(users.heldElsewhere, false))!;
}
