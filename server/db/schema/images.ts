import { index, integer, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";

import { sites } from "./sites";
import { users } from "./users";

/**
 * Every uploaded image: a display copy and a thumbnail in object storage, metadata stripped.
 * The same picture (same bytes) uploaded twice at one site is stored once.
 */
export const images = pgTable(
  "images",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    /** SHA-256 of the uploaded file's bytes, hex. */
    sha256: text("sha256").notNull(),
    displayKey: text("display_key").notNull(),
    thumbKey: text("thumb_key").notNull(),
    contentType: text("content_type").notNull(),
    width: integer("width").notNull(),
    height: integer("height").notNull(),
    /** Size of the stored display copy. */
    bytes: integer("bytes").notNull(),
    originalBytes: integer("original_bytes").notNull(),
    uploadedBy: uuid("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("images_site_sha256_unique").on(table.siteId, table.sha256),
    index("images_site_idx").on(table.siteId),
  ],
);

/**
 * Objects written (or about to be written) to storage whose image row is not committed yet.
 * Removed in the transaction that records the image; whatever remains after a failure or a crash
 * is deleted from storage by the reconciler, so no object is left without a row.
 */
export const pendingObjects = pgTable("pending_objects", {
  key: text("key").primaryKey(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
