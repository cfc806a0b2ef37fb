import { useMemo } from "react";

import { newDeviceId } from "@/lib/device-ids";

import { type AnswerFields, type AuditReview, reviewAudit } from "../lib/answer-rules";
import { auditDevice } from "../lib/audit-device";
import { preparePhoto } from "../lib/photo-file";
import { refusalsByItem } from "../lib/refusals";
import { unconfirmedAirChanges, ventilationFigures } from "../lib/ventilation-figures";

/** The audit still has unanswered items or problems; nothing was submitted. */
export class AuditNotReadyError extends Error {
  override readonly name = "AuditNotReadyError";
  constructor(readonly review: AuditReview) {
    super("Answer or put right the items listed, then submit again.");
  }
}

export interface AuditActions {
  answer(itemId: string, fields: AnswerFields): Promise<void>;
  addPhoto(itemId: string, file: File): Promise<void>;
  removePhoto(photoId: string): Promise<boolean>;
  submit(): Promise<void>;
}

/** What the auditor can do to a draft; every action is written to the phone first. */
export function useAuditActions(auditId: string): AuditActions {
  return useMemo(
    () => ({
      async answer(itemId, fields) {
        const { store } = await auditDevice();
        await store.saveAnswer(auditId, itemId, fields, new Date());
      },
      async addPhoto(itemId, file) {
        const prepared = await preparePhoto(file);
        const { store } = await auditDevice();
        await store.addPhoto({
          id: newDeviceId(),
          auditId,
          itemId,
          ...prepared,
          takenAt: new Date().toISOString(),
        });
      },
      async removePhoto(photoId) {
        const { store } = await auditDevice();
        return store.removePhoto(photoId);
      },
      async submit() {
        const { store } = await auditDevice();
        // Judged on what the store holds now, after any answer saved a moment ago, not on what
        // the screen last drew.
        const [audit, answers, photos, changes] = await Promise.all([
          store.getAudit(auditId),
          store.getAnswers(auditId),
          store.getPhotos(auditId),
          store.changesForAudit(auditId),
        ]);
        const photoCounts = new Map<string, number>();
        for (const photo of photos) {
          photoCounts.set(photo.itemId, (photoCounts.get(photo.itemId) ?? 0) + 1);
        }
        const items = audit?.detail?.items ?? [];
        const byItem = new Map(answers.map((answer) => [answer.itemId, answer]));
        const room = audit?.detail?.room ?? null;
        const review = reviewAudit(items, byItem, photoCounts, {
          ...unconfirmedAirChanges(
            items,
            byItem,
            room ? ventilationFigures(items, byItem, room) : null,
          ),
          ...refusalsByItem(changes, photos, audit?.submitRefusals ?? null),
        });
        if (!audit?.detail || !review.ready) throw new AuditNotReadyError(review);
        await store.requestSubmit(auditId, new Date());
      },
    }),
    [auditId],
  );
}
