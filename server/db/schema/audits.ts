import { sql } from "drizzle-orm";
import { verdicts } from "../../../shared/calc/verdict";
import {
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  unique,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { checklistItems, checklistVersions } from "./checklists";
import { spaces } from "./floors";
import { images } from "./images";
import { sites } from "./sites";
import { users } from "./users";

export const auditStatusEnum = pgEnum("audit_status", ["draft", "submitted"]);
export const verdictEnum = pgEnum("verdict", verdicts);
export const outcomeEnum = pgEnum("outcome", ["pass", "fail", "not_applicable"]);

/** An audit of one space. Its id is made by the auditor's device, so a retried sync is harmless. */
export const audits = pgTable(
  "audits",
  {
    id: uuid("id").primaryKey(),
    // History is never removed with the place it describes: retire the place instead.
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    checklistVersionId: uuid("checklist_version_id")
      .notNull()
      .references(() => checklistVersions.id, { onDelete: "restrict" }),
    auditorId: uuid("auditor_id")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    status: auditStatusEnum("status").notNull().default("draft"),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull(),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    verdict: verdictEnum("verdict"),
    score: doublePrecision("score"),
    /** The version of the readiness rules that decided the verdict (see shared/calc/verdict.ts). */
    rulesVersion: integer("rules_version"),
    /** Why the verdict, in words, as decided; null for verdicts decided before reasons were kept. */
    verdictReasons: jsonb("verdict_reasons").$type<string[]>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index("audits_space_idx").on(table.spaceId, table.submittedAt),
    index("audits_site_idx").on(table.siteId, table.submittedAt),
    // The committee's export walks every submitted audit of a period in time order.
    index("audits_submitted_idx")
      .on(table.submittedAt, table.id)
      .where(sql`status = 'submitted'`),
  ],
);

export const auditAnswers = pgTable(
  "audit_answers",
  {
    id: uuid("id").primaryKey(),
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audits.id, { onDelete: "cascade" }),
    itemId: uuid("item_id")
      .notNull()
      .references(() => checklistItems.id, { onDelete: "restrict" }),
    outcome: outcomeEnum("outcome"),
    /** SI: Pa, m³/h, percent, air changes per hour, minutes. */
    value: doublePrecision("value"),
    unit: varchar("unit", { length: 10 }),
    /** The reading as the auditor entered it, in `unit` (thresholds are judged in this unit). */
    enteredValue: doublePrecision("entered_value"),
    count: integer("count"),
    choice: varchar("choice", { length: 40 }),
    note: text("note"),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [unique("audit_answers_item_unique").on(table.auditId, table.itemId)],
);

export const auditPhotos = pgTable(
  "audit_photos",
  {
    id: uuid("id").primaryKey(),
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audits.id, { onDelete: "cascade" }),
    itemId: uuid("item_id").references(() => checklistItems.id, { onDelete: "restrict" }),
    imageId: uuid("image_id")
      .notNull()
      .references(() => images.id, { onDelete: "restrict" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index("audit_photos_audit_idx").on(table.auditId)],
);

/** How often a space is audited; absent means the default for its zone type. */
export const spaceCadences = pgTable("space_cadences", {
  spaceId: uuid("space_id")
    .primaryKey()
    .references(() => spaces.id, { onDelete: "cascade" }),
  cadenceDays: integer("cadence_days").notNull(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});
