import { eq, sql } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import { users } from "../../db/schema/index";

/** Every address of the network's people, invited ones included, lower-cased. */
export async function addressesOfNetwork(db: DbOrTx, networkId: string): Promise<Set<string>> {
  const rows = await db
    .select({ email: sql<string>`lower(${users.email})` })
    .from(users)
    .where(eq(users.networkId, networkId));
  return new Set(rows.map((row) => row.email));
}
