import type { Observation, ObservationBody, SequenceVersion } from "@shared/schemas/observations";

import { ApiError } from "@/lib/api-client";

export const doffingAreaSpaceId = "3c4d5e6f-7a8b-4c9d-8e0f-1a2b3c4d5e6f";

/** Removal, example 1 — CDC poster "How to Safely Remove PPE" (CS250672): gloves, eye protection, gown, mask; hand hygiene last. */
const removalSteps = [
  { key: "gloves", text: "Take off the gloves", handHygiene: false },
  { key: "eyes", text: "Take off the goggles or face shield", handHygiene: false },
  { key: "gown", text: "Take off the gown", handHygiene: false },
  { key: "mask", text: "Take off the mask or respirator", handHygiene: false },
  { key: "hands", text: "Hand hygiene after all PPE is removed", handHygiene: true },
] as const;

export function removalSequence(id = "5a000000-0000-4000-8000-000000000001"): SequenceVersion {
  return {
    id,
    key: "standard-removal-1",
    kind: "removal",
    version: 1,
    status: "published",
    title: "Removal, standard ensemble (example 1)",
    note: null,
    publishedAt: "2026-01-01T00:00:00.000Z",
    steps: removalSteps.map((step, index) => ({
      id: `5b000000-0000-4000-8000-${String(index + 1).padStart(12, "0")}`,
      key: step.key,
      position: index + 1,
      text: step.text,
      handHygiene: step.handHygiene,
      watchFor: ["out_of_order", "touched_face_or_clean_clothing"],
      reference: "CDC, How to Safely Remove PPE (CS250672), example 1",
    })),
  };
}

export function puttingOnSequence(): SequenceVersion {
  return {
    ...removalSequence("5a000000-0000-4000-8000-000000000002"),
    key: "standard-putting-on",
    kind: "putting_on",
    title: "Putting on, standard ensemble",
  };
}

/** What the server would answer for a body: its own reply shape, with a breach count. */
export function observationReply(observationId: string, body: ObservationBody): Observation {
  const breached = body.steps
    .map((step, index) => (step.breaches.length > 0 ? index + 1 : 0))
    .filter((position) => position > 0);
  return {
    id: observationId,
    siteId: "6a000000-0000-4000-8000-000000000001",
    spaceId: body.spaceId,
    spaceName: "Doffing area 1",
    zoneType: "doffing_area",
    sequenceVersionId: body.sequenceVersionId,
    sequenceTitle: "Removal, standard ensemble (example 1)",
    sequenceKind: "removal",
    observerId: "2d8b4c1e-5f6a-4b7c-8d9e-0f1a2b3c4d5e",
    staffCode: body.staffCode,
    staffRole: body.staffRole,
    startedAt: body.startedAt,
    finishedAt: body.finishedAt,
    outcome: breached.length > 0 ? "breaches_seen" : "clean_run",
    breachCount: body.steps.reduce((sum, step) => sum + step.breaches.length, 0),
    breachedSteps: breached,
    handHygiene: { performed: 1, expected: 1 },
    coachingGiven: body.coachingGiven,
    findings: [],
  };
}

/** Like the server: the same body again changes nothing; a different one under the same id is refused. */
export class FakeObservations {
  readonly stored = new Map<string, ObservationBody>();
  readonly calls: string[] = [];

  async putObservation(observationId: string, body: ObservationBody): Promise<Observation> {
    this.calls.push(`observation ${observationId}`);
    const known = this.stored.get(observationId);
    if (known && JSON.stringify(known) !== JSON.stringify(body)) {
      throw new ApiError({
        status: 409,
        code: "conflict",
        message: "An observation with this id was already recorded with other content.",
      });
    }
    this.stored.set(observationId, body);
    return observationReply(observationId, body);
  }
}
