import { randomUUID } from "node:crypto";

import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import type { Database } from "../../server/db/client";
import { auditAnswers, auditPhotos, audits, floors, spaces } from "../../server/db/schema/index";
import { storeImage } from "../../server/lib/images";
import type { AppDeps } from "../../server/lib/routes";
import {
  checklistItemsOf,
  ensureDefaultChecklists,
  latestPublishedVersion,
} from "../../server/modules/checklists/checklists.service";
import { jpegWithGps } from "./images";

export async function insertFloor(db: Database, siteId: string) {
  const [row] = await db
    .insert(floors)
    .values({ siteId, building: "Test block", level: 1, name: `Level ${randomUUID().slice(0, 4)}` })
    .returning();
  return row!;
}

/** A space on the floor: a 200 × 100 rectangle whose centre is (200, 150). */
export async function insertSpace(
  db: Database,
  floor: { id: string; siteId: string },
  zoneType: ZoneType = "doffing_area",
) {
  const [row] = await db
    .insert(spaces)
    .values({
      floorId: floor.id,
      siteId: floor.siteId,
      zoneType,
      name: `Space ${randomUUID().slice(0, 6)}`,
      polygon: [
        [100, 100],
        [300, 100],
        [300, 200],
        [100, 200],
      ],
    })
    .returning();
  return row!;
}

/**
 * A draft audit of the space with every item answered: the items whose text starts with one of
 * `fail` fail (with a note, and the photo such items ask for); everything else passes. Submitting
 * it over HTTP is left to the test.
 */
export async function answeredDraftAudit(
  deps: AppDeps,
  input: {
    networkId: string;
    space: { id: string; siteId: string; zoneType: ZoneType };
    auditorId: string;
    fail: string[];
  },
): Promise<{ auditId: string; failed: ChecklistItem[] }> {
  const { db } = deps;
  await ensureDefaultChecklists(db, input.networkId);
  const version = (await latestPublishedVersion(db, input.networkId, input.space.zoneType))!;
  const auditId = randomUUID();
  await db.insert(audits).values({
    id: auditId,
    siteId: input.space.siteId,
    spaceId: input.space.id,
    checklistVersionId: version.id,
    auditorId: input.auditorId,
    startedAt: new Date(),
  });
  return answerEveryItem(deps, { ...input, auditId, checklistVersionId: version.id });
}

/** Answers every item of an existing draft as `answeredDraftAudit` does. */
export async function answerEveryItem(
  deps: AppDeps,
  input: {
    auditId: string;
    checklistVersionId: string;
    space: { siteId: string };
    auditorId: string;
    fail: string[];
  },
): Promise<{ auditId: string; failed: ChecklistItem[] }> {
  const { db } = deps;
  const { auditId } = input;
  const items = await checklistItemsOf(db, input.checklistVersionId);
  const failed = items.filter((item) => input.fail.some((text) => item.text.startsWith(text)));
  if (failed.length !== input.fail.length)
    throw new Error(`not every failing item was found: ${input.fail.join("; ")}`);
  await db.insert(auditAnswers).values(
    items.map((item) => {
      const fails = failed.includes(item);
      return {
        id: randomUUID(),
        auditId,
        itemId: item.id,
        outcome: fails ? ("fail" as const) : ("pass" as const),
        note: fails ? `Found at audit: ${item.text}` : null,
      };
    }),
  );
  for (const item of failed.filter((candidate) => candidate.photoOnFail)) {
    const image = await storeImage(deps, {
      siteId: input.space.siteId,
      uploadedBy: input.auditorId,
      buffer: await jpegWithGps({ colour: `#${randomUUID().slice(0, 6)}` }),
      field: "photo",
    });
    await db
      .insert(auditPhotos)
      .values({ id: randomUUID(), auditId, itemId: item.id, imageId: image.id });
  }
  return { auditId, failed };
}
