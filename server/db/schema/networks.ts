import { pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";

/** One network per install is the usual case; the column is kept so data stays partitioned. */
export const networks = pgTable("networks", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
