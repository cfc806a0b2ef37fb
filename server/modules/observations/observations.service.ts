import { createHash, randomUUID } from "node:crypto";

import { observationOutcome } from "@shared/calc/observation-outcome";
import { defaultChecklists } from "@shared/checklists/defaults";
import { itemKeyForSpaceProblem, precheckProblems } from "@shared/observations/space-problem-items";
import { can } from "@shared/permissions";
import {
  observedZoneTypes,
  type Observation,
  type ObservationBody,
  type ObservationSettings,
  type PrecheckKey,
  type SpaceProblem,
} from "@shared/schemas/observations";
import type { ZoneType } from "@shared/zones";

import type { Database } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { AppDeps, SignedIn } from "../../lib/context";
import { recordObservationFindings, type FailedItem } from "../actions/actions.service";
import {
  checklistItemsOf,
  ensureDefaultChecklists,
  latestPublishedVersion,
} from "../checklists/checklists.service";
import * as repo from "./observations.repository";
import {
  ensureDefaultSequences,
  sequenceVersionById,
  stepsOfSequenceVersion,
} from "./sequences.service";

const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });
const conflict = (message: string) => new AppError("conflict", 409, message);

export const siteOfObservation = (db: Database, observationId: string) =>
  repo.siteOfObservation(db, observationId);

export async function siteOfSpace(db: Database, spaceId: string) {
  return (await repo.findSpace(db, spaceId))?.siteId ?? null;
}

/**
 * Staff codes are shown only to the site's auditors and administrators. A code is never a
 * person: it is linked to no account and listed nowhere else.
 */
export function maySeeStaffCodes(auth: SignedIn, siteId: string): boolean {
  return (
    can(auth.grants, "conduct:audit:site", siteId) || can(auth.grants, "update:site:site", siteId)
  );
}

type Row = Awaited<ReturnType<typeof repo.observationRows>>[number];

function toObservation(row: Row, auth: SignedIn): Observation {
  const o = row.observation;
  // Failed area checks and space-caused breaches, each item once.
  const found = new Map<string, string>();
  for (const check of o.precheck ?? []) {
    const itemKey =
      !check.ok && check.actionId
        ? itemKeyForSpaceProblem(row.zoneType, precheckProblems[check.key as PrecheckKey])
        : null;
    if (itemKey && check.actionId) found.set(itemKey, check.actionId);
  }
  for (const finding of row.findings) {
    const itemKey = finding.spaceProblem
      ? itemKeyForSpaceProblem(row.zoneType, finding.spaceProblem)
      : null;
    if (itemKey && finding.actionId) found.set(itemKey, finding.actionId);
  }
  const findings = [...found].map(([itemKey, actionId]) => ({ itemKey, actionId }));
  return {
    id: o.id,
    siteId: o.siteId,
    spaceId: o.spaceId,
    spaceName: row.spaceName,
    zoneType: row.zoneType,
    sequenceVersionId: o.sequenceVersionId,
    sequenceTitle: row.sequenceTitle,
    sequenceKind: row.sequenceKind,
    observerId: o.observerId,
    staffCode: maySeeStaffCodes(auth, o.siteId) ? o.staffCode : null,
    staffRole: o.staffRole,
    startedAt: o.startedAt.toISOString(),
    finishedAt: o.finishedAt.toISOString(),
    outcome: o.outcome,
    breachCount: o.breachCount,
    breachedSteps: row.breachedSteps,
    handHygiene: { performed: o.handHygienePerformed, expected: o.handHygieneExpected },
    coachingGiven: o.coachingGiven,
    findings: [...new Map(findings.map((f) => [f.itemKey, f])).values()],
  };
}

export async function observationFor(
  db: Database,
  auth: SignedIn,
  observationId: string,
): Promise<Observation> {
  const [row] = await repo.observationRows(db, repo.byId(observationId));
  if (!row) throw notFound("That observation");
  return toObservation(row, auth);
}

export async function observationsOfSpace(
  db: Database,
  auth: SignedIn,
  spaceId: string,
): Promise<Observation[]> {
  const rows = await repo.observationRows(db, repo.bySpace(spaceId), 500);
  return rows.map((row) => toObservation(row, auth));
}

/** The body as the schema normalised it, hashed: the same observation sent again hashes alike. */
export function bodyHashOf(body: ObservationBody): string {
  return createHash("sha256").update(JSON.stringify(body)).digest("hex");
}

const problemWords: Record<SpaceProblem, string> = {
  no_hand_rub_within_reach: "no hand rub within reach",
  bin_full: "the waste bin was full",
  no_clean_dirty_separation: "no separation of the clean and dirty sides",
};

/** The checklist item of the space each space-caused problem is a finding against. */
async function failedItemsFor(
  db: Database,
  networkId: string,
  zoneType: ZoneType,
  problems: ReadonlySet<SpaceProblem>,
  sequenceTitle: string,
): Promise<FailedItem[]> {
  if (problems.size === 0) return [];
  await ensureDefaultChecklists(db, networkId);
  const version = await latestPublishedVersion(db, networkId, zoneType);
  const items = version ? await checklistItemsOf(db, version.id) : [];
  return [...problems].flatMap((problem) => {
    const key = itemKeyForSpaceProblem(zoneType, problem);
    if (!key) return [];
    const item =
      items.find((candidate) => candidate.key === key) ??
      defaultChecklists[zoneType].items.find((candidate) => candidate.key === key);
    if (!item) return [];
    return [
      {
        itemId: "id" in item ? item.id : randomUUID(),
        key,
        text: item.text,
        severity: item.severity,
        // Lintel's words only: the change log is kept after the observation's detail is removed.
        note: `Seen while observing "${sequenceTitle}": ${problemWords[problem]}.`,
      },
    ];
  });
}

/**
 * Records a finished observation sent by the observer's phone with the id it made. The first
 * time it is stored whole in one transaction, with its outcome decided here; the same body again
 * gets the same reply; the same id with other content is refused.
 */
export async function recordObservation(
  deps: AppDeps,
  auth: SignedIn,
  observationId: string,
  body: ObservationBody,
  actor: Actor,
): Promise<{ created: boolean; observation: Observation }> {
  const db = deps.db;
  const networkId = auth.user.networkId;
  const bodyHash = bodyHashOf(body);
  const replay = (existing: repo.ObservationRow) => {
    if (existing.observerId !== auth.user.id || existing.bodyHash !== bodyHash)
      throw conflict(
        "That observation id is already in use for an observation with other content.",
      );
  };
  const existing = await repo.findObservation(db, observationId);
  if (existing) {
    replay(existing);
    return { created: false, observation: await observationFor(db, auth, observationId) };
  }

  const space = await repo.findSpace(db, body.spaceId);
  if (!space) throw notFound("That space");
  if (!(observedZoneTypes as readonly string[]).includes(space.zoneType))
    throw invalid("spaceId", `${space.name} is not a donning zone, doffing area or anteroom.`);
  if (space.retiredAt && new Date(body.startedAt) >= space.retiredAt)
    throw conflict(`${space.name} was retired and takes no new observations.`);
  const started = new Date(body.startedAt);
  const finished = new Date(body.finishedAt);
  if (finished < started) throw invalid("finishedAt", "It finished before it started.");
  if (finished.getTime() > Date.now() + 10 * 60 * 1000)
    throw invalid("finishedAt", "That time has not come yet.");

  await ensureDefaultSequences(db, networkId);
  const version = await sequenceVersionById(db, body.sequenceVersionId);
  // Published, or published once and since replaced: a phone keeps the version it showed.
  if (!version || version.networkId !== networkId || version.status !== "published")
    throw invalid("sequenceVersionId", "That is not a sequence published in this network.");
  const steps = await stepsOfSequenceVersion(db, version.id);
  const stepIds = new Set(steps.map((step) => step.id));
  const seen = new Set<string>();
  body.steps.forEach((record, index) => {
    if (!stepIds.has(record.stepId))
      throw invalid(`steps.${index}.stepId`, "That step is not in this sequence version.");
    if (seen.has(record.stepId))
      throw invalid(`steps.${index}.stepId`, "That step is answered twice.");
    seen.add(record.stepId);
    if (!record.done && record.breaches.length === 0)
      throw invalid(
        `steps.${index}.breaches`,
        "A step not done needs a breach saying so (step skipped).",
      );
  });
  const missing = steps.filter((step) => !seen.has(step.id));
  if (missing.length > 0)
    throw invalid(
      "steps",
      `Every step needs an answer; step ${missing.map((step) => step.position).join(", ")} has none.`,
    );

  const result = observationOutcome(steps, body.steps);
  // What the space lacked: the area check's failed items and the space-caused breaches.
  const problems = new Set([
    ...body.precheck.flatMap((check) => (check.ok ? [] : [precheckProblems[check.key]])),
    ...body.steps.flatMap((record) =>
      record.breaches.flatMap((breach) =>
        breach.cause === "space" && breach.spaceProblem ? [breach.spaceProblem] : [],
      ),
    ),
  ]);
  const failed = await failedItemsFor(db, networkId, space.zoneType, problems, version.title);

  const stored = await db.transaction(async (tx) => {
    await repo.lockObservationId(tx, observationId);
    // The same observation sent twice at once: the second waits here, then answers as a replay.
    const raced = await repo.findObservation(tx, observationId);
    if (raced) {
      replay(raced);
      return { created: false, queued: 0 };
    }
    await repo.insertObservation(tx, {
      id: observationId,
      siteId: space.siteId,
      spaceId: space.id,
      sequenceVersionId: version.id,
      observerId: auth.user.id,
      staffCode: body.staffCode,
      staffRole: body.staffRole,
      startedAt: started,
      finishedAt: finished,
      outcome: result.outcome,
      breachCount: result.breachCount,
      handHygienePerformed: result.handHygiene.performed,
      handHygieneExpected: result.handHygiene.expected,
      coachingGiven: body.coachingGiven,
      coachingNote: body.coachingNote,
      precheck: body.precheck,
      bodyHash,
    });
    await repo.insertSteps(
      tx,
      result.steps.map((step) => ({
        observationId,
        stepId: step.stepId,
        position: step.position,
        done: step.done,
        breached: step.breached,
      })),
    );
    // A technique breach is the person's, never the space's: only space-caused ones are findings.
    const { queued, actionIds } = await recordObservationFindings(
      tx,
      deps.env,
      { id: observationId, siteId: space.siteId, spaceId: space.id },
      failed,
      actor,
      new Date(),
    );
    const actionFor = (problem: SpaceProblem) => {
      const key = itemKeyForSpaceProblem(space.zoneType, problem);
      return key ? (actionIds.get(key) ?? null) : null;
    };
    if (body.precheck.some((check) => !check.ok))
      await repo.setPrecheck(
        tx,
        observationId,
        body.precheck.map((check) => ({
          ...check,
          actionId: check.ok ? null : actionFor(precheckProblems[check.key]),
        })),
      );
    await repo.insertBreaches(
      tx,
      body.steps.flatMap((record) =>
        record.breaches.map((breach) => {
          const key =
            breach.cause === "space" && breach.spaceProblem
              ? itemKeyForSpaceProblem(space.zoneType, breach.spaceProblem)
              : null;
          return {
            observationId,
            stepId: record.stepId,
            kind: breach.kind,
            cause: breach.cause,
            spaceProblem: breach.cause === "space" ? breach.spaceProblem : null,
            note: breach.note,
            actionId: key ? (actionIds.get(key) ?? null) : null,
          };
        }),
      ),
    );
    // No staff code or note in the change log: it is kept for good, the detail is not.
    await recordChange(tx, actor, {
      action: "observation.recorded",
      entity: "observation",
      entityId: observationId,
      siteId: space.siteId,
      after: {
        spaceId: space.id,
        sequenceVersionId: version.id,
        outcome: result.outcome,
        breachCount: result.breachCount,
        breachedSteps: result.breachedSteps,
        steps: steps.length,
      },
    });
    return { created: true, queued };
  });
  if (stored.queued > 0) deps.notifyOutbox();
  return { created: stored.created, observation: await observationFor(db, auth, observationId) };
}

export async function observationSettingsOf(
  db: Database,
  networkId: string,
): Promise<ObservationSettings> {
  return { retentionDays: await repo.retentionDaysOf(db, networkId) };
}

export async function saveObservationSettings(
  db: Database,
  networkId: string,
  body: ObservationSettings,
  actor: Actor,
): Promise<ObservationSettings> {
  await db.transaction(async (tx) => {
    const before = await repo.retentionDaysOf(tx, networkId);
    await repo.saveRetentionDays(tx, networkId, body.retentionDays);
    await recordChange(tx, actor, {
      action: "observation.retention_set",
      entity: "observation_settings",
      entityId: networkId,
      siteId: null,
      before: { retentionDays: before },
      after: { retentionDays: body.retentionDays },
    });
  });
  return observationSettingsOf(db, networkId);
}

/** Removes observation detail past each network's retention period; returns how many. */
export async function purgeObservationDetail(db: Database, now = new Date()): Promise<number> {
  return (await repo.purgeDetail(db, now)).length;
}
