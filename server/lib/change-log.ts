import type { DbOrTx } from "../db/client";
import { changeLog } from "../db/schema/index";

export interface Actor {
  /** Null for the system (demo data, scheduled work). */
  userId: string | null;
  requestId: string | null;
}

export interface ChangeEntry {
  action: string;
  entity: string;
  entityId: string | null;
  siteId: string | null;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
}

/** Call inside the transaction that makes the change, so both land or neither does. */
export async function recordChange(tx: DbOrTx, actor: Actor, entry: ChangeEntry): Promise<void> {
  await tx.insert(changeLog).values({
    actorId: actor.userId,
    requestId: actor.requestId,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId,
    siteId: entry.siteId,
    before: entry.before ?? null,
    after: entry.after ?? null,
    reason: entry.reason ?? null,
  });
}
