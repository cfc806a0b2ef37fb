import {
  AnswerRefusal,
  decideAnswer as decideByRules,
  type DecidedAnswer,
} from "@shared/calc/answer-rules";
import { readinessOf, rulesVersion, scoreOf } from "@shared/calc/verdict";
import { minimumAirChangesFor } from "@shared/calc/ventilation";
import { notApplicableNeedsNote } from "@shared/checklists/defaults";
import { can } from "@shared/permissions";
import type {
  AmendmentBody,
  Answer,
  AnswerBody,
  Audit,
  AuditDetail,
  MyDueEntry,
  ScheduleEntry,
  StartAuditBody,
} from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import { readTogether, type Database, type DbOrTx, type Tx } from "../../db/client";
import { AppError, forbidden, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { databaseCodeOf } from "../../lib/database-errors";
import { sha256Of, storeImage } from "../../lib/images";
import type { AppDeps, SignedIn } from "../../lib/context";
import {
  checklistItemsOf,
  checklistVersionById,
  ensureDefaultChecklists,
  latestPublishedVersion,
} from "../checklists/checklists.service";
import { recordFindings } from "../actions/actions.service";
import { countAmendment, countSubmittedAudit } from "../committee/committee.service";
import { listSitesFor } from "../sites/sites.service";
import * as repo from "./audits.repository";

const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });
const readOnly = () =>
  new AppError(
    "conflict",
    409,
    "This audit is submitted and can no longer change. Start a new audit to record something new.",
  );

/** Default audit cadence by zone type (common practice: weekly for isolation rooms, else monthly). */
export const defaultCadenceDays: Record<ZoneType, number> = {
  isolation_room: 7,
  anteroom: 30,
  donning_zone: 30,
  doffing_area: 30,
};

export async function siteOfAudit(db: Database, auditId: string) {
  return (await repo.findAudit(db, auditId))?.siteId ?? null;
}

export async function siteOfSpace(db: Database, spaceId: string) {
  return (await repo.findSpaceForAudit(db, spaceId))?.siteId ?? null;
}

async function roomOf(db: DbOrTx, spaceId: string): Promise<AuditDetail["room"]> {
  const space = await repo.findSpaceForAudit(db, spaceId);
  const ventilated =
    space && (space.zoneType === "isolation_room" || space.zoneType === "anteroom");
  return ventilated
    ? {
        volumeM3: space.volumeM3,
        constructionClass: space.constructionClass,
        // An isolation room without a class is judged as new or renovated until one is set.
        minimumAirChanges: minimumAirChangesFor(space.zoneType, space.constructionClass),
      }
    : null;
}

export async function auditDetail(db: DbOrTx, auditId: string): Promise<AuditDetail> {
  const audit = await repo.findAudit(db, auditId);
  if (!audit) throw notFound("That audit");
  const [items, answers, photos, room] = await readTogether(db, [
    () => checklistItemsOf(db, audit.checklistVersionId),
    () => repo.answersOf(db, auditId),
    () => repo.photosOf(db, auditId),
    () => roomOf(db, audit.spaceId),
  ]);
  return { audit, items, answers, photos, room };
}

/**
 * A draft is its auditor's work in progress: besides them only the site's administrators see it.
 * Everyone else at the site is told it does not exist, as lists leave it out.
 */
function canSee(audit: Pick<Audit, "status" | "auditorId" | "siteId">, auth: SignedIn) {
  return (
    audit.status === "submitted" ||
    audit.auditorId === auth.user.id ||
    can(auth.grants, "update:site:site", audit.siteId)
  );
}

/** The audit as the person may see it (404 for someone else's draft). */
export async function auditDetailFor(
  db: Database,
  auth: SignedIn,
  auditId: string,
): Promise<AuditDetail> {
  const audit = await repo.findAudit(db, auditId);
  if (!audit || !canSee(audit, auth)) throw notFound("That audit");
  return auditDetail(db, auditId);
}

/**
 * Whether an image of the site is shown only in drafts the person may not see, so it is not theirs
 * to see either. An image also on a submitted audit, the person's own draft, a plan or a proof is.
 */
export async function imageHiddenFrom(
  db: Database,
  auth: SignedIn,
  image: { id: string; siteId: string },
): Promise<boolean> {
  if (can(auth.grants, "update:site:site", image.siteId)) return false;
  const uses = await repo.usesOfImage(db, image.id);
  return (
    uses.audits.length > 0 &&
    !uses.elsewhere &&
    uses.audits.every((audit) => audit.status === "draft" && audit.auditorId !== auth.user.id)
  );
}

/** Starts the audit with the id the device made; the same request again returns the same audit. */
export async function startAudit(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  body: StartAuditBody,
  actor: Actor,
): Promise<{ created: boolean; detail: AuditDetail }> {
  const existing = await repo.findAudit(deps.db, auditId);
  if (existing) {
    if (existing.spaceId !== body.spaceId || existing.auditorId !== auth.user.id) {
      throw new AppError("conflict", 409, "That audit id is already in use for another audit.");
    }
    return { created: false, detail: await auditDetail(deps.db, auditId) };
  }
  const space = await repo.findSpaceForAudit(deps.db, body.spaceId);
  if (!space) throw notFound("That space");
  // An audit begun on a phone before the space was retired still arrives; a new one may not.
  if (space.retiredAt && new Date(body.startedAt) >= space.retiredAt) {
    throw new AppError(
      "conflict",
      409,
      `${space.name} was retired on ${space.retiredAt.toISOString().slice(0, 10)} and takes no new audits. An administrator can restore it.`,
    );
  }
  await ensureDefaultChecklists(deps.db, auth.user.networkId);
  const version = body.checklistVersionId
    ? await checklistVersionById(deps.db, body.checklistVersionId)
    : await latestPublishedVersion(deps.db, auth.user.networkId, space.zoneType);
  if (body.checklistVersionId) {
    // A phone that began offline keeps the version it showed the auditor, even if it has been
    // republished since; but only a version once published for this kind of space.
    if (
      !version ||
      version.networkId !== auth.user.networkId ||
      version.zoneType !== space.zoneType ||
      version.status !== "published"
    ) {
      throw invalid(
        "checklistVersionId",
        `That checklist version is not one published for ${space.name}'s kind of space.`,
      );
    }
  }
  if (!version) throw notFound("A checklist for this zone type");
  const created = await deps.db.transaction(async (tx) => {
    const inserted = await repo.insertAudit(tx, {
      id: auditId,
      siteId: space.siteId,
      spaceId: space.id,
      checklistVersionId: version.id,
      auditorId: auth.user.id,
      startedAt: new Date(body.startedAt),
    });
    if (inserted) {
      await recordChange(tx, actor, {
        action: "audit.started",
        entity: "audit",
        entityId: auditId,
        siteId: space.siteId,
        after: { spaceId: space.id, checklistVersion: version.version },
      });
    }
    return inserted;
  });
  return { created, detail: await auditDetail(deps.db, auditId) };
}

/**
 * Every write to an audit — an answer, a photo, the submission, an amendment — runs here: the
 * audit's row lock is taken first, so a write either lands while the audit is a draft or finds it
 * submitted, and the submission decides its verdict from exactly the answers that stay stored.
 */
async function withLockedAudit<T>(
  db: Database,
  auth: SignedIn | null,
  auditId: string,
  work: (tx: Tx, audit: Audit) => Promise<T>,
): Promise<T> {
  return db.transaction(async (tx) => {
    const audit = await repo.lockAudit(tx, auditId);
    if (!audit || (auth && !canSee(audit, auth))) throw notFound("That audit");
    return work(tx, audit);
  });
}

/** Only the auditor who started an audit writes to it. */
function requireAuditor(audit: Audit, auth: SignedIn) {
  if (audit.auditorId !== auth.user.id) throw forbidden();
}

const idInUse = (what: string) =>
  new AppError("conflict", 409, `That ${what} id is already used for something else.`, {
    fields: { id: `This ${what} id is already used for something else; make a new one.` },
  });

/**
 * The answer rules live in shared/ (the phone judges with the same ones); here a refusal becomes
 * a 400 naming the field.
 */
function decideAnswer(item: ChecklistItem, body: AnswerBody, room: AuditDetail["room"]) {
  try {
    return decideByRules(item, body, room);
  } catch (error) {
    if (error instanceof AnswerRefusal) throw invalid(error.field, error.message);
    throw error;
  }
}

/** The same answer again; the entered value follows from the stored value and unit. */
function sameAnswer(stored: Answer, decided: DecidedAnswer) {
  return (
    stored.outcome === decided.outcome &&
    stored.value === decided.value &&
    stored.unit === decided.unit &&
    stored.count === decided.count &&
    stored.choice === decided.choice &&
    stored.note === decided.note
  );
}

/**
 * Stores the answer while the audit is a draft. Once it is submitted, the same answer sent again
 * (the phone retrying after a lost reply) gets the stored answer back; any other answer is a 409.
 */
export async function saveAnswer(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  itemId: string,
  body: AnswerBody,
) {
  return withLockedAudit(deps.db, auth, auditId, async (tx, audit) => {
    requireAuditor(audit, auth);
    const [items, room] = await readTogether(tx, [
      () => checklistItemsOf(tx, audit.checklistVersionId),
      () => roomOf(tx, audit.spaceId),
    ]);
    const item = items.find((candidate) => candidate.id === itemId);
    if (!item) throw notFound("That checklist item in this audit");
    if (body.outcome === "not_applicable" && notApplicableNeedsNote(item.key) && !body.note?.trim())
      throw invalid("note", "This item can be marked not applicable only with a note saying why.");
    const decided = decideAnswer(item, body, room);
    const owner = await repo.findAnswerOwner(tx, body.id);
    if (owner && (owner.auditId !== auditId || owner.itemId !== itemId)) throw idInUse("answer");
    if (audit.status === "submitted") {
      const stored = await repo.findAnswer(tx, auditId, itemId);
      if (stored && sameAnswer(stored, decided)) return stored;
      throw readOnly();
    }
    try {
      return await repo.upsertAnswer(tx, { id: body.id, auditId, itemId, ...decided });
    } catch (error) {
      // Another audit took the id between the check and the insert.
      if (databaseCodeOf(error) === "23505") throw idInUse("answer");
      throw error;
    }
  });
}

type StoredPhoto = NonNullable<Awaited<ReturnType<typeof repo.findPhoto>>>;

/**
 * The photo already stored under this id, when the upload is the same one again (same audit, item
 * and bytes); a different upload under a taken id is a 409. null when the id is new.
 */
async function storedPhotoFor(
  db: DbOrTx,
  auditId: string,
  input: { id: string; itemId: string | null; sha256: string },
): Promise<StoredPhoto | null> {
  const stored = await repo.findPhoto(db, input.id);
  if (!stored) return null;
  if (
    stored.auditId !== auditId ||
    stored.itemId !== input.itemId ||
    stored.sha256 !== input.sha256
  ) {
    throw idInUse("photo");
  }
  return stored;
}

const photoOf = (photo: { id: string; itemId: string | null; imageId: string }) => ({
  id: photo.id,
  itemId: photo.itemId,
  imageId: photo.imageId,
});

export async function addPhoto(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  input: { id: string; itemId: string | null; buffer: Buffer },
) {
  const audit = await repo.findAudit(deps.db, auditId);
  if (!audit || !canSee(audit, auth)) throw notFound("That audit");
  requireAuditor(audit, auth);
  const upload = { id: input.id, itemId: input.itemId, sha256: sha256Of(input.buffer) };
  const replayed = await storedPhotoFor(deps.db, auditId, upload);
  if (replayed) return { created: false, photo: photoOf(replayed) };
  if (audit.status === "submitted") throw readOnly();
  if (input.itemId) {
    const items = await checklistItemsOf(deps.db, audit.checklistVersionId);
    if (!items.some((item) => item.id === input.itemId))
      throw invalid("itemId", "That item is not in this audit.");
  }
  // The picture goes to storage before the lock is taken, so a slow upload holds nobody up.
  const image = await storeImage(deps, {
    siteId: audit.siteId,
    uploadedBy: auth.user.id,
    buffer: input.buffer,
    field: "photo",
  });
  return withLockedAudit(deps.db, auth, auditId, async (tx, locked) => {
    const doubled = await storedPhotoFor(tx, auditId, upload);
    if (doubled) return { created: false, photo: photoOf(doubled) };
    if (locked.status === "submitted") throw readOnly();
    const photo = await repo.insertPhoto(tx, {
      id: input.id,
      auditId,
      itemId: input.itemId,
      imageId: image.id,
    });
    if (photo) return { created: true, photo };
    // Another audit took the id a moment ago.
    throw idInUse("photo");
  });
}

/**
 * Submits once every item is answered: not applicable on a critical item needs a note, and a
 * failed item that asks for a photo needs one. Submitting again returns the same result.
 */
export async function submitAudit(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  actor: Actor,
): Promise<AuditDetail> {
  const queued = await withLockedAudit(deps.db, auth, auditId, async (tx, current) => {
    requireAuditor(current, auth);
    // Submitting again (a retry after a lost reply) returns the same result.
    if (current.status === "submitted") return 0;
    // Read under the lock: no answer or photo can change between here and the commit.
    const detail = await auditDetail(tx, auditId);
    const answers = new Map(detail.answers.map((answer) => [answer.itemId, answer]));
    const photographed = new Set(detail.photos.map((photo) => photo.itemId));
    const problems: Record<string, string> = {};
    for (const item of detail.items) {
      const answer = answers.get(item.id);
      if (!answer?.outcome) problems[`items.${item.id}`] = "Not answered yet.";
      else if (
        answer.outcome === "not_applicable" &&
        item.severity === "critical" &&
        !answer.note
      ) {
        problems[`items.${item.id}`] = "Not applicable on a critical item needs a note saying why.";
      } else if (answer.outcome === "fail" && item.photoOnFail && !photographed.has(item.id)) {
        problems[`items.${item.id}`] = "Add a photo of what failed.";
      }
    }
    if (Object.keys(problems).length > 0) {
      throw new AppError(
        "validation_failed",
        400,
        `${Object.keys(problems).length} item(s) need attention before submitting.`,
        { fields: problems },
      );
    }

    const scored = detail.items.map((item) => ({
      key: item.key,
      text: item.text,
      severity: item.severity,
      outcome: answers.get(item.id)!.outcome!,
    }));
    const { verdict, reasons } = readinessOf(current.zoneType, scored);
    const score = scoreOf(scored);
    // Every failed item becomes a finding followed up by a corrective action, in the same commit.
    const failed = detail.items.flatMap((item) => {
      const answer = answers.get(item.id)!;
      return answer.outcome === "fail"
        ? [
            {
              itemId: item.id,
              key: item.key,
              text: item.text,
              severity: item.severity,
              note: answer.note,
            },
          ]
        : [];
    });
    const submittedAt = new Date();
    await repo.markSubmitted(tx, auditId, {
      verdict,
      score,
      submittedAt,
      rulesVersion,
      verdictReasons: reasons,
    });
    await recordChange(tx, actor, {
      action: "audit.submitted",
      entity: "audit",
      entityId: auditId,
      siteId: current.siteId,
      after: { verdict, score, rulesVersion, reasons },
    });
    await countSubmittedAudit(tx, {
      siteId: current.siteId,
      zoneType: current.zoneType,
      submittedAt,
      verdict,
      answers: detail.items.map((item) => ({
        key: item.key,
        outcome: answers.get(item.id)!.outcome,
      })),
    });
    return recordFindings(tx, deps.env, current, failed, actor, submittedAt);
  });
  if (queued > 0) deps.notifyOutbox();
  return auditDetail(deps.db, auditId);
}

/**
 * A submitted audit never changes silently: an administrator's correction is logged with its
 * reason and the before and after, and the verdict and score are decided again.
 */
export async function amendAudit(
  deps: AppDeps,
  auditId: string,
  body: AmendmentBody,
  actor: Actor,
): Promise<AuditDetail> {
  const queued = await withLockedAudit(deps.db, null, auditId, async (tx) => {
    const detail = await auditDetail(tx, auditId);
    if (detail.audit.status !== "submitted") {
      throw new AppError(
        "conflict",
        409,
        "Only submitted audits are amended; the auditor can still change a draft.",
      );
    }
    const before = detail.answers.find((answer) => answer.itemId === body.itemId);
    if (!before) throw invalid("itemId", "That item has no answer in this audit.");
    const item = detail.items.find((candidate) => candidate.id === body.itemId)!;
    if (
      body.outcome === "not_applicable" &&
      item.severity === "critical" &&
      !(body.note ?? before.note)
    ) {
      throw invalid("note", "Not applicable on a critical item needs a note saying why.");
    }
    await repo.setAnswerOutcome(tx, auditId, body.itemId, body.outcome, body.note);
    const outcomes = detail.items.flatMap((candidate) => {
      const outcome =
        candidate.id === body.itemId
          ? body.outcome
          : detail.answers.find((answer) => answer.itemId === candidate.id)?.outcome;
      return outcome
        ? [{ key: candidate.key, text: candidate.text, severity: candidate.severity, outcome }]
        : [];
    });
    // An amendment decides again under the current rules, whichever version decided before.
    const { verdict, reasons } = readinessOf(detail.audit.zoneType, outcomes);
    const score = scoreOf(outcomes);
    await repo.setVerdict(tx, auditId, { verdict, score, rulesVersion, verdictReasons: reasons });
    await recordChange(tx, actor, {
      action: "audit.amended",
      entity: "audit",
      entityId: auditId,
      siteId: detail.audit.siteId,
      before: {
        itemId: body.itemId,
        outcome: before.outcome,
        note: before.note,
        verdict: detail.audit.verdict,
        rulesVersion: detail.audit.rulesVersion,
      },
      after: {
        itemId: body.itemId,
        outcome: body.outcome,
        note: body.note ?? before.note,
        verdict,
        rulesVersion,
        reasons,
      },
      reason: body.reason,
    });
    await countAmendment(tx, {
      siteId: detail.audit.siteId,
      zoneType: detail.audit.zoneType,
      submittedAt: new Date(detail.audit.submittedAt!),
      verdictBefore: detail.audit.verdict,
      verdictAfter: verdict,
      key: item.key,
      outcomeBefore: before.outcome,
      outcomeAfter: body.outcome,
    });
    // A correction to "fail" is a finding like any other; one away from "fail" leaves the action
    // to be done only when an auditor confirms the fix, so nothing is closed silently.
    if (body.outcome !== "fail" || before.outcome === "fail") return 0;
    return recordFindings(
      tx,
      deps.env,
      detail.audit,
      [
        {
          itemId: item.id,
          key: item.key,
          text: item.text,
          severity: item.severity,
          note: body.note ?? before.note,
        },
      ],
      actor,
      new Date(),
    );
  });
  if (queued > 0) deps.notifyOutbox();
  return auditDetail(deps.db, auditId);
}

export const auditsOfSpace = (db: Database, spaceId: string, userId: string) =>
  repo.auditsOfSpace(db, spaceId, userId);

/** How many audits, drafts included, the spaces have; any at all is history a delete must keep. */
export const countAuditsOfSpaces = (db: DbOrTx, spaceIds: readonly string[]) =>
  repo.countAuditsOfSpaces(db, spaceIds);

/** What is due and overdue at a site: the latest submitted audit of each space plus its cadence. */
export async function siteSchedule(
  db: Database,
  siteId: string,
  now = new Date(),
): Promise<ScheduleEntry[]> {
  const rows = await repo.scheduleRows(db, siteId);
  const day = 24 * 60 * 60 * 1000;
  const entries = rows.map((row) => {
    const cadenceDays = row.cadenceDays ?? defaultCadenceDays[row.zoneType];
    const from = row.lastAuditAt ?? row.createdAt;
    const dueAt = row.lastAuditAt ? new Date(from.getTime() + cadenceDays * day) : from;
    const remaining = dueAt.getTime() - now.getTime();
    const state: ScheduleEntry["state"] =
      remaining < 0
        ? "overdue"
        : remaining <= Math.max(2 * day, cadenceDays * day * 0.2)
          ? "due_soon"
          : "ok";
    return {
      spaceId: row.spaceId,
      spaceName: row.spaceName,
      zoneType: row.zoneType,
      floorId: row.floorId,
      floorName: row.floorName,
      cadenceDays,
      lastAuditAt: row.lastAuditAt?.toISOString() ?? null,
      dueAt: dueAt.toISOString(),
      state,
      verdict: row.verdict,
      lastAuditorName: row.lastAuditorName,
    };
  });
  const rank = { overdue: 0, due_soon: 1, ok: 2 };
  return entries.sort((a, b) => rank[a.state] - rank[b.state] || a.dueAt.localeCompare(b.dueAt));
}

/** Overdue and soon-due spaces at every site where the person audits, overdue first. */
export async function myDue(deps: AppDeps, auth: SignedIn): Promise<MyDueEntry[]> {
  const sites = await listSitesFor(deps.db, auth.user.networkId, auth.grants);
  const mine = sites.filter((site) => can(auth.grants, "conduct:audit:site", site.id));
  const rank = { overdue: 0, due_soon: 1, ok: 2 };
  const entries = await Promise.all(
    mine.map(async (site) =>
      (await siteSchedule(deps.db, site.id))
        .filter((entry) => entry.state !== "ok")
        .map((entry) => ({ ...entry, siteId: site.id, siteName: site.name })),
    ),
  );
  return entries
    .flat()
    .sort((a, b) => rank[a.state] - rank[b.state] || a.dueAt.localeCompare(b.dueAt));
}

export async function setCadence(
  db: Database,
  spaceId: string,
  cadenceDays: number,
  actor: Actor,
  siteId: string,
) {
  await db.transaction(async (tx) => {
    await repo.setCadence(tx, spaceId, cadenceDays);
    await recordChange(tx, actor, {
      action: "space.cadence_set",
      entity: "space",
      entityId: spaceId,
      siteId,
      after: { cadenceDays },
    });
  });
  return { cadenceDays };
}
