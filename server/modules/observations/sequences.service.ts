import { randomUUID } from "node:crypto";

import {
  defaultSequences,
  type DefaultSequence,
  type DefaultSequenceStep,
} from "@shared/observations/default-sequences";
import { canSomewhere, can } from "@shared/permissions";
import type {
  SequenceDraftBody,
  SequencesResponse,
  SequenceVersion,
} from "@shared/schemas/observations";

import type { Database, DbOrTx } from "../../db/client";
import { AppError, forbidden, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { SignedIn } from "../../lib/context";
import { databaseCodeOf } from "../../lib/database-errors";
import * as repo from "./sequences.repository";

const system: Actor = { userId: null, requestId: null };

/** Positions are 1-based: they are the step numbers the observer and the committee see. */
function stepRow(step: DefaultSequenceStep | SequenceDraftBody["steps"][number], position: number) {
  return {
    key: step.key ?? `step-${randomUUID().slice(0, 8)}`,
    position,
    text: step.text,
    handHygiene: step.handHygiene,
    watchFor: [...step.watchFor],
    reference: step.reference ?? null,
  };
}

/**
 * Gives the network Lintel's default sequences, each published as its version 1, the way
 * checklists get theirs: called wherever sequences are read or used, and by the demo data. A key
 * the network already has (published or drafted) is left alone; two callers at once agree,
 * because the second insert of a version 1 is refused by the database and theirs stands.
 */
export async function ensureDefaultSequences(
  db: DbOrTx,
  networkId: string,
  defaults: readonly DefaultSequence[] = defaultSequences,
): Promise<void> {
  const existing = await repo.keysOf(db, networkId);
  for (const sequence of defaults) {
    if (existing.has(sequence.key)) continue;
    try {
      await db.transaction(async (tx) => {
        const version = await repo.insertVersion(tx, {
          networkId,
          key: sequence.key,
          kind: sequence.kind,
          version: 1,
          status: "published",
          title: sequence.title,
          note: sequence.note,
          publishedAt: new Date(),
        });
        await repo.replaceSteps(
          tx,
          version.id,
          sequence.steps.map((step, index) => stepRow(step, index + 1)),
        );
        await recordChange(tx, system, {
          action: "sequence.default_published",
          entity: "sequence",
          entityId: version.id,
          siteId: null,
          after: { key: sequence.key, version: 1 },
        });
      });
    } catch (error) {
      if (databaseCodeOf(error) !== "23505") throw error;
    }
  }
}

/** Who may read the sequences: whoever may observe somewhere, and administrators. */
export function assertMayReadSequences(auth: SignedIn): void {
  if (
    !canSomewhere(auth.grants, "conduct:audit:site") &&
    !can(auth.grants, "manage:checklists:network")
  )
    throw forbidden();
}

export async function listSequences(db: Database, auth: SignedIn): Promise<SequencesResponse> {
  assertMayReadSequences(auth);
  const networkId = auth.user.networkId;
  await ensureDefaultSequences(db, networkId);
  const versions = await repo.currentVersions(db, networkId);
  const keys = [...new Set(versions.map((version) => version.key))];
  return {
    sequences: keys.map((key) => ({
      key,
      published:
        versions.find((version) => version.key === key && version.status === "published") ?? null,
      draft: versions.find((version) => version.key === key && version.status === "draft") ?? null,
    })),
  };
}

const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });

/** Creates or replaces a sequence's draft; a key the network does not have yet makes a new sequence. */
export async function saveDraft(
  db: Database,
  networkId: string,
  key: string,
  body: SequenceDraftBody,
  actor: Actor,
): Promise<SequenceVersion> {
  await ensureDefaultSequences(db, networkId);
  const keys = body.steps.flatMap((step) => (step.key ? [step.key] : []));
  if (new Set(keys).size !== keys.length) throw invalid("steps", "Two steps share a key.");
  return db.transaction(async (tx) => {
    const published = await repo.latestPublished(tx, networkId, key);
    // A sequence keeps its kind: observations of it are counted together.
    if (published && published.kind !== body.kind)
      throw invalid(
        "kind",
        `${published.title} is a ${published.kind.replace("_", " ")} sequence.`,
      );
    let draft = await repo.findDraft(tx, networkId, key);
    draft ??= await repo.insertVersion(tx, {
      networkId,
      key,
      kind: body.kind,
      version: await repo.nextVersionNumber(tx, networkId, key),
      status: "draft",
      title: body.title,
      note: body.note ?? null,
    });
    await repo.updateVersion(tx, draft.id, {
      title: body.title,
      kind: body.kind,
      note: body.note ?? null,
    });
    await repo.replaceSteps(
      tx,
      draft.id,
      body.steps.map((step, index) => stepRow(step, index + 1)),
    );
    await recordChange(tx, actor, {
      action: "sequence.draft_saved",
      entity: "sequence",
      entityId: draft.id,
      siteId: null,
      after: { key, ...body },
    });
    return {
      id: draft.id,
      key,
      kind: body.kind,
      version: draft.version,
      status: "draft",
      title: body.title,
      note: body.note ?? null,
      publishedAt: null,
      steps: await repo.stepsOfVersion(tx, draft.id),
    };
  });
}

export async function publishDraft(
  db: Database,
  networkId: string,
  key: string,
  actor: Actor,
): Promise<SequenceVersion> {
  return db.transaction(async (tx) => {
    const draft = await repo.findDraft(tx, networkId, key);
    if (!draft) throw notFound("A draft of this sequence");
    const publishedAt = new Date();
    await repo.updateVersion(tx, draft.id, {
      status: "published",
      publishedAt,
      publishedBy: actor.userId,
    });
    await recordChange(tx, actor, {
      action: "sequence.published",
      entity: "sequence",
      entityId: draft.id,
      siteId: null,
      after: { key, version: draft.version },
    });
    return {
      id: draft.id,
      key,
      kind: draft.kind,
      version: draft.version,
      status: "published",
      title: draft.title,
      note: draft.note,
      publishedAt: publishedAt.toISOString(),
      steps: await repo.stepsOfVersion(tx, draft.id),
    };
  });
}

export async function discardDraft(
  db: Database,
  networkId: string,
  key: string,
  actor: Actor,
): Promise<void> {
  await db.transaction(async (tx) => {
    const draft = await repo.findDraft(tx, networkId, key);
    if (!draft) throw notFound("A draft of this sequence");
    await repo.deleteVersion(tx, draft.id);
    await recordChange(tx, actor, {
      action: "sequence.draft_discarded",
      entity: "sequence",
      entityId: draft.id,
      siteId: null,
    });
  });
}

export const sequenceVersionById = repo.findVersion;
export const stepsOfSequenceVersion = repo.stepsOfVersion;
