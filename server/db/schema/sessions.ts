import { index, pgTable, timestamp, uuid } from "drizzle-orm/pg-core";

import { identityProviders } from "./identity-providers";
import { users } from "./users";

/** A session id is a random UUID (122 random bits) carried only in the httpOnly cookie. */
export const sessions = pgTable(
  "sessions",
  {
    id: uuid("id").primaryKey(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: timestamp("expires_at", { withTimezone: true, mode: "date" }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    /**
     * The provider the session was begun through (null: password or link). Such a session is
     * never extended; it ends with the provider's removal.
     */
    providerId: uuid("provider_id").references(() => identityProviders.id, {
      onDelete: "cascade",
    }),
  },
  (table) => [index("sessions_user_id_idx").on(table.userId)],
);
