import { sql } from "drizzle-orm";
import {
  boolean,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import {
  breachCauses,
  breachKinds,
  observationOutcomes,
  sequenceKinds,
  spaceProblems,
  staffRoles,
} from "../../../shared/schemas/observations";
import { correctiveActions } from "./actions";
import { checklistStatusEnum } from "./checklists";
import { spaces } from "./floors";
import { networks } from "./networks";
import { sites } from "./sites";
import { users } from "./users";

export const sequenceKindEnum = pgEnum("sequence_kind", sequenceKinds);
export const breachKindEnum = pgEnum("breach_kind", breachKinds);
export const breachCauseEnum = pgEnum("breach_cause", breachCauses);
export const spaceProblemEnum = pgEnum("space_problem", spaceProblems);
export const staffRoleEnum = pgEnum("staff_role", staffRoles);
export const observationOutcomeEnum = pgEnum("observation_outcome", observationOutcomes);

/**
 * One version of a putting-on or removal sequence for a network, like a checklist: published
 * versions never change, an observation keeps the version it was done with, and at most one
 * draft per sequence is being edited.
 */
export const sequenceVersions = pgTable(
  "sequence_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    networkId: uuid("network_id")
      .notNull()
      .references(() => networks.id, { onDelete: "cascade" }),
    /** Stable across versions: "standard-putting-on", "standard-removal-1", … */
    key: varchar("key", { length: 60 }).notNull(),
    kind: sequenceKindEnum("kind").notNull(),
    version: integer("version").notNull(),
    status: checklistStatusEnum("status").notNull(),
    title: varchar("title", { length: 120 }).notNull(),
    note: varchar("note", { length: 300 }),
    publishedAt: timestamp("published_at", { withTimezone: true }),
    publishedBy: uuid("published_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("sequence_versions_number_unique").on(table.networkId, table.key, table.version),
    uniqueIndex("sequence_versions_one_draft")
      .on(table.networkId, table.key)
      .where(sql`status = 'draft'`),
  ],
);

export const sequenceSteps = pgTable(
  "sequence_steps",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => sequenceVersions.id, { onDelete: "cascade" }),
    /** Stable across versions. */
    key: varchar("key", { length: 60 }).notNull(),
    position: integer("position").notNull(),
    text: varchar("text", { length: 300 }).notNull(),
    handHygiene: boolean("hand_hygiene").notNull().default(false),
    watchFor: jsonb("watch_for").$type<string[]>().notNull().default([]),
    reference: varchar("reference", { length: 300 }),
  },
  (table) => [
    index("sequence_steps_version_idx").on(table.versionId, table.position),
    unique("sequence_steps_key_unique").on(table.versionId, table.key),
  ],
);

/**
 * One observed putting-on or removal. Its id is made by the observer's phone, so a retried sync
 * is harmless. The person observed is a staff code and role, never a name. After the network's
 * retention period the detail goes (staff code, notes, breaches, pre-check): the outcome, the
 * hand-hygiene counts and which steps were breached stay for the committee's counts.
 */
export const observations = pgTable(
  "observations",
  {
    id: uuid("id").primaryKey(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    sequenceVersionId: uuid("sequence_version_id")
      .notNull()
      .references(() => sequenceVersions.id, { onDelete: "restrict" }),
    observerId: uuid("observer_id")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    /** Null once the detail is past the retention period. */
    staffCode: varchar("staff_code", { length: 16 }),
    staffRole: staffRoleEnum("staff_role").notNull(),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull(),
    finishedAt: timestamp("finished_at", { withTimezone: true }).notNull(),
    outcome: observationOutcomeEnum("outcome").notNull(),
    breachCount: integer("breach_count").notNull(),
    handHygienePerformed: integer("hand_hygiene_performed").notNull(),
    handHygieneExpected: integer("hand_hygiene_expected").notNull(),
    coachingGiven: boolean("coaching_given").notNull(),
    coachingNote: text("coaching_note"),
    /**
     * The area check before the observation: [{ key, ok, actionId }], a failed check naming the
     * corrective action it opened or joined. Null once past retention.
     */
    precheck: jsonb("precheck").$type<{ key: string; ok: boolean; actionId?: string | null }[]>(),
    /** The body as received, hashed: a replay with the same content is answered as the first. */
    bodyHash: varchar("body_hash", { length: 64 }).notNull(),
    detailRemovedAt: timestamp("detail_removed_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index("observations_site_idx").on(table.siteId, table.finishedAt),
    index("observations_staff_idx").on(table.siteId, table.staffCode, table.finishedAt),
  ],
);

/** Each step of an observation: done or not, and whether anything went wrong there. Kept. */
export const observationSteps = pgTable(
  "observation_steps",
  {
    observationId: uuid("observation_id")
      .notNull()
      .references(() => observations.id, { onDelete: "cascade" }),
    stepId: uuid("step_id")
      .notNull()
      .references(() => sequenceSteps.id, { onDelete: "restrict" }),
    position: integer("position").notNull(),
    done: boolean("done").notNull(),
    breached: boolean("breached").notNull(),
  },
  (table) => [primaryKey({ columns: [table.observationId, table.stepId] })],
);

/** What went wrong at a step, and why. Removed with the detail after the retention period. */
export const observationBreaches = pgTable(
  "observation_breaches",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    observationId: uuid("observation_id")
      .notNull()
      .references(() => observations.id, { onDelete: "cascade" }),
    stepId: uuid("step_id")
      .notNull()
      .references(() => sequenceSteps.id, { onDelete: "restrict" }),
    kind: breachKindEnum("kind").notNull(),
    cause: breachCauseEnum("cause").notNull(),
    spaceProblem: spaceProblemEnum("space_problem"),
    note: text("note"),
    /** The corrective action a space-caused breach joined or opened. */
    actionId: uuid("action_id").references(() => correctiveActions.id, { onDelete: "set null" }),
  },
  (table) => [index("observation_breaches_observation_idx").on(table.observationId)],
);

/** How long a network keeps observation detail (staff codes, notes, breaches); default two years. */
export const observationSettings = pgTable("observation_settings", {
  networkId: uuid("network_id")
    .primaryKey()
    .references(() => networks.id, { onDelete: "cascade" }),
  retentionDays: integer("retention_days").notNull().default(730),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});
