import { randomUUID } from "node:crypto";

import {
  defaultChecklistRevision,
  defaultChecklists,
  requiredIsolationRoomKeys,
  type DefaultChecklist,
  type DefaultItem,
} from "@shared/checklists/defaults";
import { defaultChecklistsV1 } from "@shared/checklists/defaults-v1";
import { and, desc, eq, sql } from "drizzle-orm";
import type {
  ChecklistDraftBody,
  ChecklistsResponse,
  ChecklistVersion,
} from "@shared/schemas/checklists";
import { zoneTypes, type ZoneType } from "@shared/zones";

import type { Database, DbOrTx } from "../../db/client";
import { changeLog, checklistVersions } from "../../db/schema/index";
import { AppError, notFound } from "../../lib/app-error";
import { databaseCodeOf } from "../../lib/database-errors";
import { recordChange, type Actor } from "../../lib/change-log";
import * as repo from "./checklists.repository";

function itemRow(item: DefaultItem | ChecklistDraftBody["items"][number], position: number) {
  return {
    key: item.key ?? `item-${randomUUID().slice(0, 8)}`,
    position,
    text: item.text,
    severity: item.severity,
    response: item.response,
    quantity: item.quantity ?? null,
    thresholdOp: item.threshold?.op ?? null,
    thresholdValue: item.threshold?.value ?? null,
    choices: item.choices ?? null,
    reference: item.reference ?? null,
    photoOnFail: item.photoOnFail ?? false,
  };
}

const defaultsByRevision: Record<number, Record<ZoneType, DefaultChecklist>> = {
  1: defaultChecklistsV1,
  [defaultChecklistRevision]: defaultChecklists,
};

/** Change-log action that marks which revision of Lintel's defaults a network has been given. */
const revisionAction = "checklist.default_revision";
const system: Actor = { userId: null, requestId: null };

interface RevisionRecord {
  revision: number;
  outcome: "published" | "draft";
  draftId: string | null;
}

/** The newest revision of the defaults recorded against the network's versions of a zone type. */
async function recordedRevision(
  db: DbOrTx,
  networkId: string,
  zoneType: ZoneType,
): Promise<RevisionRecord | null> {
  const [row] = await db
    .select({ after: changeLog.after })
    .from(changeLog)
    .innerJoin(checklistVersions, eq(checklistVersions.id, changeLog.entityId))
    .where(
      and(
        eq(changeLog.action, revisionAction),
        eq(checklistVersions.networkId, networkId),
        eq(checklistVersions.zoneType, zoneType),
      ),
    )
    .orderBy(desc(sql`(${changeLog.after}->>'revision')::int`))
    .limit(1);
  return (row?.after as RevisionRecord | undefined) ?? null;
}

/**
 * Gives the network each zone type's default checklist, up to `revision` of Lintel's defaults.
 * A network without one gets the defaults published as its version 1. A network still on an
 * older default it never edited gets the new default published as its next version (audits
 * already done keep the version they started with). A network that published its own version
 * gets the new default as a draft beside it, for its administrator to merge; while it has a
 * draft of its own open, the offer waits.
 */
export async function ensureDefaultChecklists(
  db: DbOrTx,
  networkId: string,
  revision = defaultChecklistRevision,
): Promise<void> {
  for (const zoneType of zoneTypes) {
    const latest = await repo.latestPublished(db, networkId, zoneType);
    const recorded = latest ? await recordedRevision(db, networkId, zoneType) : null;
    // Version 1 published by the system before revisions were recorded is revision 1.
    const current = recorded?.revision ?? (latest ? 1 : 0);
    if (current >= revision) continue;
    const defaults = defaultsByRevision[revision]![zoneType];
    try {
      await db.transaction(async (tx) => {
        if (!latest) {
          const version = await repo.insertVersion(tx, {
            networkId,
            zoneType,
            version: 1,
            status: "published",
            title: defaults.title,
            publishedAt: new Date(),
          });
          await repo.replaceItems(tx, version.id, defaults.items.map(itemRow));
          await recordRevision(tx, version.id, zoneType, { revision, outcome: "published" });
          return;
        }
        const draft = await repo.findDraft(tx, networkId, zoneType);
        if (draft) return;
        const unedited =
          latest.publishedBy === null &&
          (latest.version === 1 || recorded?.outcome === "published");
        const version = await repo.insertVersion(tx, {
          networkId,
          zoneType,
          version: await repo.nextVersionNumber(tx, networkId, zoneType),
          status: unedited ? "published" : "draft",
          title: unedited ? defaults.title : latest.title,
          publishedAt: unedited ? new Date() : null,
        });
        await repo.replaceItems(tx, version.id, defaults.items.map(itemRow));
        if (unedited)
          await recordRevision(tx, version.id, zoneType, { revision, outcome: "published" });
        // Recorded against the network's own version, which stays if the draft is discarded.
        else
          await recordRevision(tx, latest.id, zoneType, {
            revision,
            outcome: "draft",
            draftId: version.id,
          });
      });
    } catch (error) {
      // Another request published it at the same moment: theirs stands.
      if (databaseCodeOf(error) !== "23505") throw error;
    }
  }
}

async function recordRevision(
  tx: DbOrTx,
  versionId: string,
  zoneType: ZoneType,
  record: { revision: number; outcome: RevisionRecord["outcome"]; draftId?: string },
): Promise<void> {
  await recordChange(tx, system, {
    action: revisionAction,
    entity: "checklist",
    entityId: versionId,
    siteId: null,
    after: { zoneType, draftId: null, ...record },
  });
}

/** Refuses an isolation-room checklist without the items that confirm inward airflow. */
function assertRequiredItems(zoneType: ZoneType, keys: readonly string[]): void {
  if (zoneType !== "isolation_room") return;
  const missing = requiredIsolationRoomKeys.filter((key) => !keys.includes(key));
  if (missing.length === 0) return;
  const message = `An isolation-room checklist must keep ${missing.join(" and ")}: together they confirm that air moves into the room.`;
  throw new AppError("validation_failed", 400, message, { fields: { items: message } });
}

export async function listChecklists(db: Database, networkId: string): Promise<ChecklistsResponse> {
  await ensureDefaultChecklists(db, networkId);
  const versions = await repo.currentVersions(db, networkId);
  return {
    checklists: await Promise.all(
      zoneTypes.map(async (zoneType) => {
        const draft = versions.find((v) => v.zoneType === zoneType && v.status === "draft") ?? null;
        const recorded = draft ? await recordedRevision(db, networkId, zoneType) : null;
        return {
          zoneType,
          published: versions.find((v) => v.zoneType === zoneType && v.status === "published")!,
          draft,
          defaultUpdate:
            recorded?.outcome === "draft" && recorded.draftId === draft?.id
              ? { revision: recorded.revision }
              : null,
        };
      }),
    ),
  };
}

/** Creates or replaces the zone type's draft. Keys of items kept from the published version stay. */
export async function saveDraft(
  db: Database,
  networkId: string,
  zoneType: ZoneType,
  body: ChecklistDraftBody,
  actor: Actor,
): Promise<ChecklistVersion> {
  await ensureDefaultChecklists(db, networkId);
  const keys = body.items.flatMap((item) => (item.key ? [item.key] : []));
  if (new Set(keys).size !== keys.length) {
    throw new AppError("validation_failed", 400, "Two items share a key.", {
      fields: { items: "Two items share a key." },
    });
  }
  assertRequiredItems(zoneType, keys);
  return db.transaction(async (tx) => {
    let draft = await repo.findDraft(tx, networkId, zoneType);
    draft ??= await repo.insertVersion(tx, {
      networkId,
      zoneType,
      version: await repo.nextVersionNumber(tx, networkId, zoneType),
      status: "draft",
      title: body.title,
    });
    await repo.updateVersion(tx, draft.id, { title: body.title });
    await repo.replaceItems(tx, draft.id, body.items.map(itemRow));
    await recordChange(tx, actor, {
      action: "checklist.draft_saved",
      entity: "checklist",
      entityId: draft.id,
      siteId: null,
      after: { zoneType, ...body },
    });
    const items = await repo.itemsOfVersion(tx, draft.id);
    return {
      id: draft.id,
      zoneType,
      version: draft.version,
      status: "draft",
      title: body.title,
      publishedAt: null,
      items,
    };
  });
}

export async function publishDraft(
  db: Database,
  networkId: string,
  zoneType: ZoneType,
  actor: Actor,
): Promise<ChecklistVersion> {
  return db.transaction(async (tx) => {
    const draft = await repo.findDraft(tx, networkId, zoneType);
    if (!draft) throw notFound("A draft of this checklist");
    assertRequiredItems(
      zoneType,
      (await repo.itemsOfVersion(tx, draft.id)).map((item) => item.key),
    );
    const publishedAt = new Date();
    await repo.updateVersion(tx, draft.id, {
      status: "published",
      publishedAt,
      publishedBy: actor.userId,
    });
    await recordChange(tx, actor, {
      action: "checklist.published",
      entity: "checklist",
      entityId: draft.id,
      siteId: null,
      after: { zoneType, version: draft.version },
    });
    const items = await repo.itemsOfVersion(tx, draft.id);
    return {
      id: draft.id,
      zoneType,
      version: draft.version,
      status: "published",
      title: draft.title,
      publishedAt: publishedAt.toISOString(),
      items,
    };
  });
}

export async function discardDraft(
  db: Database,
  networkId: string,
  zoneType: ZoneType,
  actor: Actor,
): Promise<void> {
  await db.transaction(async (tx) => {
    const draft = await repo.findDraft(tx, networkId, zoneType);
    if (!draft) throw notFound("A draft of this checklist");
    await repo.deleteVersion(tx, draft.id);
    await recordChange(tx, actor, {
      action: "checklist.draft_discarded",
      entity: "checklist",
      entityId: draft.id,
      siteId: null,
    });
  });
}

export const latestPublishedVersion = repo.latestPublished;
export const checklistItemsOf = repo.itemsOfVersion;
export const checklistVersionById = repo.findVersion;
