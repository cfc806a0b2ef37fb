import { scoreOf, verdictOf } from "@shared/calc/verdict";
import {
  cfmToCubicMetresPerHour,
  inchesOfWaterToPascals,
  minimumAirChanges,
} from "@shared/calc/ventilation";
import { can } from "@shared/permissions";
import type {
  AmendmentBody,
  AnswerBody,
  AuditDetail,
  MyDueEntry,
  ReadingUnit,
  ScheduleEntry,
} from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import type { Database, DbOrTx } from "../../db/client";
import { AppError, forbidden, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { storeImage } from "../../lib/images";
import type { AppDeps, SignedIn } from "../../lib/routes";
import {
  checklistItemsOf,
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

export async function auditDetail(db: Database, auditId: string): Promise<AuditDetail> {
  const audit = await repo.findAudit(db, auditId);
  if (!audit) throw notFound("That audit");
  const [items, answers, photos, space] = await Promise.all([
    checklistItemsOf(db, audit.checklistVersionId),
    repo.answersOf(db, auditId),
    repo.photosOf(db, auditId),
    repo.findSpaceForAudit(db, audit.spaceId),
  ]);
  const ventilated =
    space && (space.zoneType === "isolation_room" || space.zoneType === "anteroom");
  return {
    audit,
    items,
    answers,
    photos,
    room: ventilated
      ? {
          volumeM3: space.volumeM3,
          constructionClass: space.constructionClass,
          minimumAirChanges: space.constructionClass
            ? minimumAirChanges[space.constructionClass]
            : null,
        }
      : null,
  };
}

/** Starts the audit with the id the device made; the same request again returns the same audit. */
export async function startAudit(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  body: { spaceId: string; startedAt: string },
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
  const version = await latestPublishedVersion(deps.db, auth.user.networkId, space.zoneType);
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
      await recordChange(
        tx,
        { userId: auth.user.id, requestId: null },
        {
          action: "audit.started",
          entity: "audit",
          entityId: auditId,
          siteId: space.siteId,
          after: { spaceId: space.id, checklistVersion: version.version },
        },
      );
    }
    return inserted;
  });
  return { created, detail: await auditDetail(deps.db, auditId) };
}

async function requireOwnDraft(db: Database, auth: SignedIn, auditId: string) {
  const audit = await repo.findAudit(db, auditId);
  if (!audit) throw notFound("That audit");
  if (audit.auditorId !== auth.user.id) throw forbidden();
  if (audit.status === "submitted") throw readOnly();
  return audit;
}

const unitsFor: Record<string, readonly ReadingUnit[]> = {
  pressure: ["Pa", "inH2O"],
  airflow: ["m3/h", "cfm"],
  air_changes: ["ach"],
  percent: ["percent"],
  minutes: ["min"],
};

/** Plausible ranges in SI, beyond which a reading is a typing slip rather than a measurement. */
const plausible: Record<string, { min: number; max: number; message: string }> = {
  pressure: {
    min: -100,
    max: 100,
    message: "A pressure differential beyond ±100 Pa is not a plausible room reading.",
  },
  airflow: { min: 0, max: 100_000, message: "Airflow must be between 0 and 100,000 m³/h." },
  air_changes: { min: 0, max: 200, message: "Air changes per hour must be between 0 and 200." },
  percent: { min: 0, max: 100, message: "A percentage is between 0 and 100." },
  minutes: { min: 0, max: 10_000, message: "Minutes must be between 0 and 10,000." },
};

function toSi(quantity: string, value: number, unit: ReadingUnit): number {
  if (unit === "inH2O") return inchesOfWaterToPascals(value);
  if (unit === "cfm") return cfmToCubicMetresPerHour(value);
  return value;
}

function meets(threshold: { op: ">=" | "<="; value: number }, value: number) {
  return threshold.op === ">=" ? value >= threshold.value : value <= threshold.value;
}

/**
 * Works out what to store for an answer: readings in SI units, and the outcome decided by the
 * item's threshold where it has one (the auditor may still mark the item not applicable).
 */
function decideAnswer(item: ChecklistItem, body: AnswerBody, room: AuditDetail["room"]) {
  const base = {
    outcome: body.outcome,
    value: null as number | null,
    unit: null as ReadingUnit | null,
    count: null as number | null,
    choice: null as string | null,
    note: body.note ?? null,
  };
  if (body.outcome === "not_applicable" || body.outcome === null) return base;

  switch (item.response) {
    case "check":
      return base;
    case "reading": {
      if (body.value === undefined || body.value === null)
        throw invalid("value", "Enter the reading.");
      const quantity = item.quantity ?? "pressure";
      const unit = body.unit ?? unitsFor[quantity]![0]!;
      if (!unitsFor[quantity]!.includes(unit))
        throw invalid("unit", `Use ${unitsFor[quantity]!.join(" or ")} for this reading.`);
      const value = toSi(quantity, body.value, unit);
      const range = plausible[quantity]!;
      if (!Number.isFinite(value) || value < range.min || value > range.max)
        throw invalid("value", range.message);
      let outcome = body.outcome;
      if (item.threshold) outcome = meets(item.threshold, value) ? "pass" : "fail";
      else if (quantity === "air_changes" && room?.minimumAirChanges)
        outcome = value >= room.minimumAirChanges ? "pass" : "fail";
      return { ...base, outcome, value, unit };
    }
    case "count": {
      if (body.count === undefined || body.count === null)
        throw invalid("count", "Enter the count.");
      const outcome = item.threshold
        ? meets(item.threshold, body.count)
          ? "pass"
          : "fail"
        : body.outcome;
      return { ...base, outcome, count: body.count };
    }
    case "choice": {
      const choice = item.choices?.find((option) => option.value === body.choice);
      if (!choice) throw invalid("choice", "Choose one of the options.");
      return {
        ...base,
        outcome: choice.passes ? ("pass" as const) : ("fail" as const),
        choice: choice.value,
      };
    }
  }
}

export async function saveAnswer(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  itemId: string,
  body: AnswerBody,
) {
  await requireOwnDraft(deps.db, auth, auditId);
  const detail = await auditDetail(deps.db, auditId);
  const item = detail.items.find((candidate) => candidate.id === itemId);
  if (!item) throw notFound("That checklist item in this audit");
  const decided = decideAnswer(item, body, detail.room);
  return repo.upsertAnswer(deps.db, { id: body.id, auditId, itemId, ...decided });
}

export async function addPhoto(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  input: { id: string; itemId: string | null; buffer: Buffer },
) {
  const existing = await repo.findPhoto(deps.db, input.id);
  if (existing) {
    if (existing.auditId !== auditId)
      throw new AppError("conflict", 409, "That photo id belongs to another audit.");
    return {
      created: false,
      photo: { id: existing.id, itemId: existing.itemId, imageId: existing.imageId },
    };
  }
  const audit = await requireOwnDraft(deps.db, auth, auditId);
  if (input.itemId) {
    const items = await checklistItemsOf(deps.db, audit.checklistVersionId);
    if (!items.some((item) => item.id === input.itemId))
      throw invalid("itemId", "That item is not in this audit.");
  }
  const image = await storeImage(deps, {
    siteId: audit.siteId,
    uploadedBy: auth.user.id,
    buffer: input.buffer,
    field: "photo",
  });
  const photo = await repo.insertPhoto(deps.db, {
    id: input.id,
    auditId,
    itemId: input.itemId,
    imageId: image.id,
  });
  // A doubled request may have inserted it a moment ago.
  return { created: Boolean(photo), photo: photo ?? (await repo.findPhoto(deps.db, input.id))! };
}

/**
 * Submits once every item is answered: not applicable on a critical item needs a note, and a
 * failed item that asks for a photo needs one. Submitting again returns the same result.
 */
export async function submitAudit(
  deps: AppDeps,
  auth: SignedIn,
  auditId: string,
  requestId: string,
): Promise<AuditDetail> {
  const current = await repo.findAudit(deps.db, auditId);
  if (!current) throw notFound("That audit");
  if (current.auditorId !== auth.user.id) throw forbidden();
  if (current.status === "submitted") return auditDetail(deps.db, auditId);

  const detail = await auditDetail(deps.db, auditId);
  const answers = new Map(detail.answers.map((answer) => [answer.itemId, answer]));
  const photographed = new Set(detail.photos.map((photo) => photo.itemId));
  const problems: Record<string, string> = {};
  for (const item of detail.items) {
    const answer = answers.get(item.id);
    if (!answer?.outcome) problems[`items.${item.id}`] = "Not answered yet.";
    else if (answer.outcome === "not_applicable" && item.severity === "critical" && !answer.note) {
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
    severity: item.severity,
    outcome: answers.get(item.id)!.outcome!,
  }));
  const verdict = verdictOf(scored);
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
  const actor = { userId: auth.user.id, requestId };
  const queued = await deps.db.transaction(async (tx) => {
    const locked = await repo.lockAudit(tx, auditId);
    if (locked?.status === "submitted") return 0;
    const submittedAt = new Date();
    await repo.markSubmitted(tx, auditId, { verdict, score, submittedAt });
    await recordChange(tx, actor, {
      action: "audit.submitted",
      entity: "audit",
      entityId: auditId,
      siteId: current.siteId,
      after: { verdict, score },
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
  const detail = await auditDetail(deps.db, auditId);
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
  const queued = await deps.db.transaction(async (tx) => {
    await repo.lockAudit(tx, auditId);
    await repo.setAnswerOutcome(tx, auditId, body.itemId, body.outcome, body.note);
    const outcomes = detail.items.flatMap((candidate) => {
      const outcome =
        candidate.id === body.itemId
          ? body.outcome
          : detail.answers.find((answer) => answer.itemId === candidate.id)?.outcome;
      return outcome ? [{ severity: candidate.severity, outcome }] : [];
    });
    const verdict = verdictOf(outcomes);
    const score = scoreOf(outcomes);
    await repo.setVerdict(tx, auditId, verdict, score);
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
      },
      after: {
        itemId: body.itemId,
        outcome: body.outcome,
        note: body.note ?? before.note,
        verdict,
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
    // to be closed by an auditor's verification, so nothing is closed silently.
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
