import type { Answer, AnswerBody, AuditDetail } from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ObservationBody } from "@shared/schemas/observations";

import { ApiError } from "@/lib/api-client";
import type { SyncTransport } from "@/features/walkthroughs/lib/sync-queue";

import { tamsinGeneral } from "./api-stub";
import { FakeObservations } from "./observation-data";

export const doffingSpaceId = "1f2e3d4c-5b6a-4978-8a6b-5c4d3e2f1a0b";
export const isolationSpaceId = "2a3b4c5d-6e7f-4a8b-9c0d-1e2f3a4b5c6d";

let counter = 0;
/** A valid v4 id, different each call, readable in a failure message. */
export function testId(): string {
  counter += 1;
  return `00000000-0000-4000-8000-${String(counter).padStart(12, "0")}`;
}

export function buildItem(overrides: Partial<ChecklistItem> = {}): ChecklistItem {
  return {
    id: testId(),
    key: `test.${counter}`,
    position: counter,
    text: "Physically separate from the donning zone",
    severity: "critical",
    response: "check",
    quantity: null,
    threshold: null,
    choices: null,
    reference: "Common practice",
    photoOnFail: true,
    ...overrides,
  };
}

/** Four items of the doffing-area checklist: a critical check, a count, a choice, a minor check. */
export function doffingItems(): ChecklistItem[] {
  return [
    buildItem({ text: "Dirty chair present and labelled as dirty", position: 1 }),
    buildItem({
      text: "Number of working hand-rub stations",
      severity: "major",
      response: "count",
      threshold: { op: ">=", value: 2 },
      position: 2,
    }),
    buildItem({
      text: "Mirror or observer position for the removal steps",
      severity: "major",
      response: "choice",
      choices: [
        { value: "mirror", label: "Mirror", passes: true },
        { value: "observer", label: "Observer position", passes: true },
        { value: "neither", label: "Neither", passes: false },
      ],
      position: 3,
    }),
    buildItem({
      text: "Removal order displayed at eye level",
      severity: "minor",
      photoOnFail: false,
      position: 4,
    }),
  ];
}

export function isolationItems(): ChecklistItem[] {
  return [
    buildItem({
      text: "Pressure differential to the corridor (negative)",
      response: "reading",
      quantity: "pressure",
      threshold: { op: "<=", value: -2.5 },
      position: 1,
    }),
    buildItem({
      text: "Exhaust airflow",
      response: "reading",
      quantity: "airflow",
      photoOnFail: false,
      position: 2,
    }),
    buildItem({
      text: "Air changes per hour at or above the threshold for the room's construction class",
      response: "reading",
      quantity: "air_changes",
      photoOnFail: false,
      position: 3,
    }),
  ];
}

export function buildDetail(
  auditId: string,
  items: ChecklistItem[],
  overrides: {
    spaceId?: string;
    spaceName?: string;
    zoneType?: AuditDetail["audit"]["zoneType"];
    room?: AuditDetail["room"];
  } = {},
): AuditDetail {
  return {
    audit: {
      id: auditId,
      siteId: tamsinGeneral.id,
      spaceId: overrides.spaceId ?? doffingSpaceId,
      spaceName: overrides.spaceName ?? "Doffing area 1",
      zoneType: overrides.zoneType ?? "doffing_area",
      spaceRetiredAt: null,
      checklistVersionId: "3b4c5d6e-7f80-4a9b-8c1d-2e3f4a5b6c7d",
      checklistVersion: 1,
      auditorId: "2d8b4c1e-5f6a-4b7c-8d9e-0f1a2b3c4d5e",
      auditorName: "Rowan Ellery",
      status: "draft",
      startedAt: "2026-03-02T09:00:00.000Z",
      submittedAt: null,
      verdict: null,
      score: null,
    },
    items,
    answers: [],
    photos: [],
    room: overrides.room ?? null,
  };
}

export const connectionLost = () =>
  new ApiError({ status: 0, code: "network_unavailable", message: "No connection to Lintel." });

const submittedConflict = () =>
  new ApiError({
    status: 409,
    code: "conflict",
    message: "This audit is submitted and can no longer change.",
  });

function sameAnswerFields(a: AnswerBody, b: AnswerBody): boolean {
  return (
    a.outcome === b.outcome &&
    (a.value ?? null) === (b.value ?? null) &&
    (a.unit ?? null) === (b.unit ?? null) &&
    (a.count ?? null) === (b.count ?? null) &&
    (a.choice ?? null) === (b.choice ?? null) &&
    (a.note ?? null) === (b.note ?? null)
  );
}

function answerReply(body: AnswerBody, itemId: string): Answer {
  return {
    id: body.id,
    itemId,
    outcome: body.outcome,
    value: body.value ?? null,
    unit: body.unit ?? null,
    count: body.count ?? null,
    choice: body.choice ?? null,
    note: body.note ?? null,
  };
}

/**
 * A stand-in for the server with its idempotency rules: audits, answers and photos are keyed by
 * the ids the phone made, so the same request twice stores one thing; a submitted audit accepts
 * only the same answer, photo or submission again.
 */
export class FakeLintel implements SyncTransport {
  readonly calls: string[] = [];
  readonly audits = new Map<string, AuditDetail>();
  readonly answers = new Map<string, AnswerBody & { itemId: string }>();
  readonly photos = new Map<string, { itemId: string; bytes: number }>();
  readonly submitted = new Set<string>();
  /** Called before each request; throw to make that request fail. */
  before: (call: string) => void = () => {};
  /** Called after the server did its work; throw to lose the reply on the way back. */
  after: (call: string) => void = () => {};

  constructor(private readonly items: ChecklistItem[]) {}

  private run<T>(call: string, work: () => T): T {
    this.calls.push(call);
    this.before(call);
    const result = work();
    this.after(call);
    return result;
  }

  async startAudit(auditId: string, body: { spaceId: string; startedAt: string }) {
    return this.run(`start ${auditId}`, () => {
      if (!this.audits.has(auditId)) {
        this.audits.set(auditId, buildDetail(auditId, this.items, { spaceId: body.spaceId }));
      }
      return this.audits.get(auditId)!;
    });
  }

  async saveAnswer(auditId: string, itemId: string, body: AnswerBody): Promise<Answer> {
    return this.run(`answer ${itemId} ${body.id}`, () => {
      if (!this.audits.has(auditId))
        throw new ApiError({
          status: 404,
          code: "not_found",
          message: "That audit was not found.",
        });
      if (body.value !== null && body.value !== undefined && Math.abs(body.value) > 100) {
        throw new ApiError({
          status: 400,
          code: "validation_failed",
          message: "Check the reading.",
          fields: {
            value: "A pressure differential beyond ±100 Pa is not a plausible room reading.",
          },
        });
      }
      const stored = this.answers.get(`${auditId}/${itemId}`);
      // Like the server: once submitted, only the same answer again is accepted (and changes nothing).
      if (this.submitted.has(auditId)) {
        if (!stored || !sameAnswerFields(stored, body)) throw submittedConflict();
        return answerReply(stored, itemId);
      }
      this.answers.set(`${auditId}/${itemId}`, { ...body, id: stored?.id ?? body.id, itemId });
      return answerReply({ ...body, id: stored?.id ?? body.id }, itemId);
    });
  }

  async uploadPhoto(auditId: string, photo: { id: string; itemId: string; file: Blob }) {
    return this.run(`photo ${photo.id}`, () => {
      const stored = this.photos.get(photo.id);
      if (this.submitted.has(auditId) && stored?.itemId !== photo.itemId) throw submittedConflict();
      if (!stored) {
        this.photos.set(photo.id, { itemId: photo.itemId, bytes: photo.file.size });
      }
      return {
        id: photo.id,
        itemId: photo.itemId,
        imageId: `7f000000-0000-4000-8000-${photo.id.slice(-12)}`,
      };
    });
  }

  readonly observations = new FakeObservations();

  async putObservation(observationId: string, body: ObservationBody) {
    return this.run(`observation ${observationId}`, () =>
      this.observations.putObservation(observationId, body),
    );
  }

  async submitAudit(auditId: string) {
    return this.run(`submit ${auditId}`, () => {
      this.submitted.add(auditId);
      const detail = this.audits.get(auditId)!;
      const submitted: AuditDetail = {
        ...detail,
        audit: {
          ...detail.audit,
          status: "submitted",
          submittedAt: "2026-03-02T09:30:00.000Z",
          verdict: "hold",
          score: 0.5,
        },
      };
      this.audits.set(auditId, submitted);
      return submitted;
    });
  }
}
