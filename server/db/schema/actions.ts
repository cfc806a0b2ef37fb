import { sql } from "drizzle-orm";
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
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import type { DuePolicy } from "@shared/calc/due";
import { actionCloseReasons, actionStates } from "../../../shared/workflow/action-workflow";

import { audits } from "./audits";
import { severityEnum } from "./checklists";
import { floors, spaces } from "./floors";
import { images } from "./images";
import { sites } from "./sites";
import { users } from "./users";

/** The workflow's states (shared/workflow/action-workflow.ts). */
export const actionStateEnum = pgEnum("action_state", actionStates);

/** Why a done action is done: an auditor confirmed the fix, or its space was retired (not a fix). */
export const actionCloseReasonEnum = pgEnum("action_close_reason", actionCloseReasons);

/** A site's due times by severity; no row means the defaults. */
export const siteDuePolicies = pgTable("site_due_policies", {
  siteId: uuid("site_id")
    .primaryKey()
    .references(() => sites.id, { onDelete: "cascade" }),
  policy: jsonb("policy").$type<DuePolicy>().notNull(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

/**
 * The work that fixes one failed item in one space, followed until an auditor has seen the fix.
 * While it is unfinished, further failures of the same item in the same space join it (the
 * partial unique index makes that hold under concurrent submits too).
 */
export const correctiveActions = pgTable(
  "corrective_actions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    // History is never removed with the place it describes: retire the place instead.
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    floorId: uuid("floor_id")
      .notNull()
      .references(() => floors.id, { onDelete: "restrict" }),
    /** The checklist item's key, stable across checklist versions. */
    itemKey: varchar("item_key", { length: 60 }).notNull(),
    title: varchar("title", { length: 300 }).notNull(),
    severity: severityEnum("severity").notNull(),
    state: actionStateEnum("state").notNull().default("to_fix"),
    assigneeId: uuid("assignee_id").references(() => users.id, { onDelete: "set null" }),
    openedAt: timestamp("opened_at", { withTimezone: true }).notNull(),
    /** Fixed when opened; reopening keeps it. */
    dueAt: timestamp("due_at", { withTimezone: true }).notNull(),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    /** Null only on actions done before reasons were kept, which were all confirmed fixes. */
    closeReason: actionCloseReasonEnum("close_reason"),
    daysToClose: doublePrecision("days_to_close"),
    /** Counts rejections and reopenings: proof of the current attempt has this round. */
    proofRound: integer("proof_round").notNull().default(0),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex("corrective_actions_one_unfinished")
      .on(table.spaceId, table.itemKey)
      .where(sql`state <> 'done'`),
    index("corrective_actions_site_idx").on(table.siteId, table.state, table.dueAt),
    index("corrective_actions_assignee_idx").on(table.assigneeId, table.state),
    index("corrective_actions_floor_idx").on(table.floorId, table.state),
    index("corrective_actions_closed_idx").on(table.siteId, table.closedAt),
  ],
);

/** A failed item of a submitted audit; each belongs to the action that follows it up. */
export const findings = pgTable(
  "findings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    actionId: uuid("action_id")
      .notNull()
      .references(() => correctiveActions.id, { onDelete: "cascade" }),
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    itemId: uuid("item_id").notNull(),
    itemKey: varchar("item_key", { length: 60 }).notNull(),
    itemText: varchar("item_text", { length: 300 }).notNull(),
    severity: severityEnum("severity").notNull(),
    note: text("note"),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("findings_audit_item_unique").on(table.auditId, table.itemId),
    index("findings_action_idx").on(table.actionId),
  ],
);

/** Photos the facilities lead attaches to show the fix. */
export const actionProofs = pgTable(
  "action_proofs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    actionId: uuid("action_id")
      .notNull()
      .references(() => correctiveActions.id, { onDelete: "cascade" }),
    imageId: uuid("image_id")
      .notNull()
      .references(() => images.id, { onDelete: "restrict" }),
    round: integer("round").notNull(),
    uploadedBy: uuid("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index("action_proofs_action_idx").on(table.actionId)],
);

/**
 * Time-based notices already queued (due soon, overdue, weekly reminders). The unique key is
 * what keeps two scheduler processes, or one catching up after downtime, from sending twice.
 */
export const actionNotices = pgTable(
  "action_notices",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    actionId: uuid("action_id")
      .notNull()
      .references(() => correctiveActions.id, { onDelete: "cascade" }),
    kind: text("kind").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [unique("action_notices_unique").on(table.actionId, table.kind)],
);
