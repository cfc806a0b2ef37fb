import { randomUUID } from "node:crypto";

import type { Database } from "../../server/db/client";
import { pressureMonitors } from "../../server/db/schema/index";
import { createUploadToken } from "../../server/modules/pressure/upload-tokens.service";
import { insertFloor, insertSpace } from "./audits";

/** A monitor id no other test uses. */
export const newMonitorId = (prefix = "mon") => `${prefix}-${randomUUID().slice(0, 12)}`;

/** A monitor mapped to a fresh isolation room at the site. */
export async function insertMonitor(db: Database, siteId: string, monitorId = newMonitorId()) {
  const space = await insertSpace(db, await insertFloor(db, siteId), "isolation_room");
  const [row] = await db
    .insert(pressureMonitors)
    .values({ monitorId, siteId, spaceId: space.id })
    .returning();
  return row!;
}

/** An upload token for the site, made as its administrator would; returns the token itself too. */
export async function insertUploadToken(
  db: Database,
  siteId: string,
  userId: string,
  name = "Gateway",
) {
  return createUploadToken(db, siteId, name, { userId, requestId: null });
}
