import { and, eq, inArray, lt } from "drizzle-orm";

import type { DbOrTx } from "../db/client";
import { images, pendingObjects } from "../db/schema/index";

const publicColumns = {
  id: images.id,
  width: images.width,
  height: images.height,
  bytes: images.bytes,
  sha256: images.sha256,
};

export async function findImageBySha(db: DbOrTx, siteId: string, sha256: string) {
  const [row] = await db
    .select(publicColumns)
    .from(images)
    .where(and(eq(images.siteId, siteId), eq(images.sha256, sha256)));
  return row ?? null;
}

/** null when the same picture was stored at the site in the meantime. */
export async function insertImage(db: DbOrTx, values: typeof images.$inferInsert) {
  const [row] = await db
    .insert(images)
    .values(values)
    .onConflictDoNothing()
    .returning(publicColumns);
  return row ?? null;
}

export async function findImageForServing(db: DbOrTx, imageId: string) {
  const [row] = await db
    .select({
      siteId: images.siteId,
      displayKey: images.displayKey,
      thumbKey: images.thumbKey,
      contentType: images.contentType,
    })
    .from(images)
    .where(eq(images.id, imageId));
  return row ?? null;
}

export async function notePendingObjects(db: DbOrTx, keys: string[]): Promise<void> {
  await db
    .insert(pendingObjects)
    .values(keys.map((key) => ({ key })))
    .onConflictDoNothing();
}

export async function clearPendingObjects(db: DbOrTx, keys: string[]): Promise<void> {
  if (keys.length > 0) await db.delete(pendingObjects).where(inArray(pendingObjects.key, keys));
}

export async function stalePendingObjects(
  db: DbOrTx,
  olderThan: Date,
  limit = 500,
): Promise<string[]> {
  const rows = await db
    .select({ key: pendingObjects.key })
    .from(pendingObjects)
    .where(lt(pendingObjects.createdAt, olderThan))
    .limit(limit);
  return rows.map((row) => row.key);
}
