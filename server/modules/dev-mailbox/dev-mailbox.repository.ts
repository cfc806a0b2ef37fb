import { and, eq, inArray } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import { outbox, users } from "../../db/schema/index";

/**
 * Of the outbox ids given, those queued for a person of the network. An address may be held by
 * an account in one network and by a pending invitation in another, so the person the e-mail
 * was queued for decides, not the address.
 */
export async function mailIdsOfNetwork(
  db: DbOrTx,
  networkId: string,
  ids: readonly string[],
): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db
    .select({ id: outbox.id })
    .from(outbox)
    .innerJoin(users, eq(users.id, outbox.recipientId))
    .where(and(eq(users.networkId, networkId), inArray(outbox.id, [...ids])));
  return new Set(rows.map((row) => row.id));
}
