import { index, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";

import { users } from "./users";

/**
 * Append-only: a trigger (migration 0001) refuses UPDATE and DELETE. Rows are written in the same
 * transaction as the change they record.
 */
export const changeLog = pgTable(
  "change_log",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
    /** Null for changes made by the system (demo data, scheduled work). */
    actorId: uuid("actor_id").references(() => users.id, { onDelete: "restrict" }),
    action: text("action").notNull(),
    entity: text("entity").notNull(),
    entityId: uuid("entity_id"),
    siteId: uuid("site_id"),
    before: jsonb("before"),
    after: jsonb("after"),
    reason: text("reason"),
    requestId: text("request_id"),
  },
  (table) => [
    index("change_log_entity_idx").on(table.entity, table.entityId),
    index("change_log_site_idx").on(table.siteId, table.occurredAt),
  ],
);
