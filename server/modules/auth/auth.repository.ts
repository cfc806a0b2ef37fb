import { eq } from "drizzle-orm";

import type { RoleGrant } from "@shared/roles";

import type { DbOrTx } from "../../db/client";
import { accountWithAddress, roleGrants, users } from "../../db/schema/index";

export interface SignInCandidate {
  id: string;
  email: string;
  name: string;
  passwordHash: string | null;
  deactivatedAt: Date | null;
}

export async function findUserForSignIn(
  db: DbOrTx,
  email: string,
): Promise<SignInCandidate | null> {
  const [row] = await db
    .select({
      id: users.id,
      email: users.email,
      name: users.displayName,
      passwordHash: users.passwordHash,
      deactivatedAt: users.deactivatedAt,
    })
    .from(users)
    .where(accountWithAddress(email))
    .limit(1);
  return row ?? null;
}

export async function listGrants(db: DbOrTx, userId: string): Promise<RoleGrant[]> {
  return db
    .select({ role: roleGrants.role, siteId: roleGrants.siteId })
    .from(roleGrants)
    .where(eq(roleGrants.userId, userId))
    .orderBy(roleGrants.role, roleGrants.siteId);
}
