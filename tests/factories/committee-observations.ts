import { randomUUID } from "node:crypto";

import type { SequenceKind } from "@shared/schemas/observations";

import type { Database } from "../../server/db/client";
import {
  observationSteps,
  observations,
  sequenceSteps,
  sequenceVersions,
} from "../../server/db/schema/index";

export interface SeededSequence {
  id: string;
  key: string;
  title: string;
  steps: { id: string; key: string; text: string; position: number; handHygiene: boolean }[];
}

/** A published sequence version with the given steps (hand hygiene where the flag says). */
export async function insertSequence(
  db: Database,
  networkId: string,
  input: {
    key: string;
    title: string;
    kind?: SequenceKind;
    version?: number;
    steps: { key: string; text: string; handHygiene?: boolean }[];
  },
): Promise<SeededSequence> {
  const [version] = await db
    .insert(sequenceVersions)
    .values({
      networkId,
      key: input.key,
      kind: input.kind ?? "removal",
      version: input.version ?? 1,
      status: "published",
      title: input.title,
      publishedAt: new Date(),
    })
    .returning({ id: sequenceVersions.id });
  const steps = await db
    .insert(sequenceSteps)
    .values(
      input.steps.map((step, index) => ({
        versionId: version!.id,
        key: step.key,
        position: index + 1,
        text: step.text,
        handHygiene: step.handHygiene ?? false,
      })),
    )
    .returning();
  return {
    id: version!.id,
    key: input.key,
    title: input.title,
    steps: steps
      .sort((a, b) => a.position - b.position)
      .map((step) => ({
        id: step.id,
        key: step.key,
        text: step.text,
        position: step.position,
        handHygiene: step.handHygiene,
      })),
  };
}

export interface ObservationRecord {
  siteId: string;
  spaceId: string;
  observerId: string;
  sequence: SeededSequence;
  /** Null: the detail is past the retention period and the code has gone. */
  staffCode: string | null;
  finishedAt: Date;
  /** Keys of the steps with a breach. */
  breachedSteps: string[];
  handHygiene: { performed: number; expected: number };
  coachingGiven: boolean;
}

/** Observation rows and their step rows, as the server keeps them (outcome from the breaches). */
export async function insertObservations(db: Database, records: readonly ObservationRecord[]) {
  const rows: (typeof observations.$inferInsert)[] = [];
  const stepRows: (typeof observationSteps.$inferInsert)[] = [];
  for (const record of records) {
    const id = randomUUID();
    rows.push({
      id,
      siteId: record.siteId,
      spaceId: record.spaceId,
      sequenceVersionId: record.sequence.id,
      observerId: record.observerId,
      staffCode: record.staffCode,
      staffRole: "nurse",
      startedAt: new Date(record.finishedAt.getTime() - 6 * 60 * 1000),
      finishedAt: record.finishedAt,
      outcome: record.breachedSteps.length > 0 ? "breaches_seen" : "clean_run",
      breachCount: record.breachedSteps.length,
      handHygienePerformed: record.handHygiene.performed,
      handHygieneExpected: record.handHygiene.expected,
      coachingGiven: record.coachingGiven,
      coachingNote: record.coachingGiven ? "Shown again at the mirror." : null,
      precheck: record.staffCode === null ? null : [],
      bodyHash: randomUUID().replace(/-/g, ""),
      detailRemovedAt: record.staffCode === null ? new Date() : null,
    });
    for (const step of record.sequence.steps)
      stepRows.push({
        observationId: id,
        stepId: step.id,
        position: step.position,
        done: true,
        breached: record.breachedSteps.includes(step.key),
      });
  }
  for (let i = 0; i < rows.length; i += 500)
    await db.insert(observations).values(rows.slice(i, i + 500));
  for (let i = 0; i < stepRows.length; i += 2000)
    await db.insert(observationSteps).values(stepRows.slice(i, i + 2000));
}
