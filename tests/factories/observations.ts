import { and, asc, desc, eq } from "drizzle-orm";

import type { Breach, ObservationBody } from "@shared/schemas/observations";

import type { Database } from "../../server/db/client";
import { sequenceSteps, sequenceVersions } from "../../server/db/schema/index";
import { ensureDefaultSequences } from "../../server/modules/observations/sequences.service";

export interface PublishedSequence {
  id: string;
  steps: { id: string; key: string; position: number; handHygiene: boolean }[];
}

/** The newest published version of a sequence in the network (Lintel's defaults, seeded). */
export async function publishedSequence(
  db: Database,
  networkId: string,
  key = "standard-removal-1",
): Promise<PublishedSequence> {
  await ensureDefaultSequences(db, networkId);
  const [version] = await db
    .select({ id: sequenceVersions.id })
    .from(sequenceVersions)
    .where(
      and(
        eq(sequenceVersions.networkId, networkId),
        eq(sequenceVersions.key, key),
        eq(sequenceVersions.status, "published"),
      ),
    )
    .orderBy(desc(sequenceVersions.version))
    .limit(1);
  if (!version) throw new Error(`No published sequence ${key}`);
  const steps = await db
    .select({
      id: sequenceSteps.id,
      key: sequenceSteps.key,
      position: sequenceSteps.position,
      handHygiene: sequenceSteps.handHygiene,
    })
    .from(sequenceSteps)
    .where(eq(sequenceSteps.versionId, version.id))
    .orderBy(asc(sequenceSteps.position));
  return { id: version.id, steps };
}

/** A finished observation of `sequence` at the space: every step done, unless told otherwise. */
export function buildObservation(
  spaceId: string,
  sequence: PublishedSequence,
  options: {
    breaches?: Record<string, Breach[]>;
    notDone?: string[];
    staffCode?: string;
    finishedAt?: Date;
    coachingNote?: string | null;
  } = {},
): ObservationBody {
  const finished = options.finishedAt ?? new Date();
  return {
    spaceId,
    sequenceVersionId: sequence.id,
    staffCode: options.staffCode ?? "RN-4471",
    staffRole: "nurse",
    startedAt: new Date(finished.getTime() - 4 * 60 * 1000).toISOString(),
    finishedAt: finished.toISOString(),
    precheck: [
      { key: "waste_not_overfull", ok: true },
      { key: "hand_rub_within_reach", ok: true },
      { key: "sides_marked", ok: true },
    ],
    steps: sequence.steps.map((step) => ({
      stepId: step.id,
      done: !(options.notDone ?? []).includes(step.key),
      breaches: options.breaches?.[step.key] ?? [],
    })),
    coachingGiven: options.coachingNote !== undefined && options.coachingNote !== null,
    coachingNote: options.coachingNote ?? null,
  };
}

export const techniqueBreach = (kind: Breach["kind"], note: string | null = null): Breach => ({
  kind,
  cause: "technique",
  spaceProblem: null,
  note,
});

export const spaceBreach = (
  kind: Breach["kind"],
  spaceProblem: NonNullable<Breach["spaceProblem"]>,
  note: string | null = null,
): Breach => ({ kind, cause: "space", spaceProblem, note });
