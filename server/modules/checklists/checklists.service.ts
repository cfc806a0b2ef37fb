import { randomUUID } from "node:crypto";

import { defaultChecklists, type DefaultItem } from "@shared/checklists/defaults";
import type {
  ChecklistDraftBody,
  ChecklistsResponse,
  ChecklistVersion,
} from "@shared/schemas/checklists";
import { zoneTypes, type ZoneType } from "@shared/zones";

import type { Database, DbOrTx } from "../../db/client";
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

/** Publishes version 1 of each default checklist the network does not have yet. */
export async function ensureDefaultChecklists(db: DbOrTx, networkId: string): Promise<void> {
  for (const zoneType of zoneTypes) {
    if (await repo.latestPublished(db, networkId, zoneType)) continue;
    const defaults = defaultChecklists[zoneType];
    try {
      await db.transaction(async (tx) => {
        const version = await repo.insertVersion(tx, {
          networkId,
          zoneType,
          version: 1,
          status: "published",
          title: defaults.title,
          publishedAt: new Date(),
        });
        await repo.replaceItems(tx, version.id, defaults.items.map(itemRow));
      });
    } catch (error) {
      // Another request published it at the same moment: theirs stands.
      if (databaseCodeOf(error) !== "23505") throw error;
    }
  }
}

export async function listChecklists(db: Database, networkId: string): Promise<ChecklistsResponse> {
  await ensureDefaultChecklists(db, networkId);
  const versions = await repo.currentVersions(db, networkId);
  return {
    checklists: zoneTypes.map((zoneType) => ({
      zoneType,
      published: versions.find((v) => v.zoneType === zoneType && v.status === "published")!,
      draft: versions.find((v) => v.zoneType === zoneType && v.status === "draft") ?? null,
    })),
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
