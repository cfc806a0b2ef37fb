import { bigint, integer, pgTable, text, timestamp, varchar } from "drizzle-orm/pg-core";

/** Demo-data steps that have run on this database; each runs once. */
export const demoSteps = pgTable("demo_steps", {
  id: text("id").primaryKey(),
  appliedAt: timestamp("applied_at", { withTimezone: true }).notNull().defaultNow(),
});

/** Counters for sign-in limits, shared by every app process (layout required by the limiter). */
export const rateLimits = pgTable("rate_limits", {
  key: varchar("key", { length: 255 }).primaryKey(),
  points: integer("points").notNull().default(0),
  expire: bigint("expire", { mode: "number" }),
});
