import { and, eq, isNull, sql } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import { accountWithAddress, userTokens, users } from "../../db/schema/index";

export type TokenPurpose = "invitation" | "password_reset";

export async function revokeOpenTokens(
  tx: DbOrTx,
  userId: string,
  purpose: TokenPurpose,
): Promise<void> {
  await tx
    .update(userTokens)
    .set({ revokedAt: new Date() })
    .where(
      and(
        eq(userTokens.userId, userId),
        eq(userTokens.purpose, purpose),
        isNull(userTokens.usedAt),
        isNull(userTokens.revokedAt),
      ),
    );
}

export async function insertToken(
  tx: DbOrTx,
  values: {
    userId: string;
    purpose: TokenPurpose;
    tokenHash: string;
    expiresAt: Date;
    createdBy: string | null;
  },
): Promise<void> {
  await tx.insert(userTokens).values(values);
}

export interface TokenWithUser {
  tokenId: string;
  expiresAt: Date;
  usedAt: Date | null;
  revokedAt: Date | null;
  userId: string;
  email: string;
  name: string;
  deactivatedAt: Date | null;
  hasPassword: boolean;
}

export async function findToken(
  tx: DbOrTx,
  tokenHash: string,
  purpose: TokenPurpose,
  options: { lock?: boolean } = {},
): Promise<TokenWithUser | null> {
  const query = tx
    .select({
      tokenId: userTokens.id,
      expiresAt: userTokens.expiresAt,
      usedAt: userTokens.usedAt,
      revokedAt: userTokens.revokedAt,
      userId: users.id,
      email: users.email,
      name: users.displayName,
      deactivatedAt: users.deactivatedAt,
      hasPassword: sql<boolean>`${users.passwordHash} is not null`,
    })
    .from(userTokens)
    .innerJoin(users, eq(users.id, userTokens.userId))
    .where(
      and(
        eq(userTokens.tokenHash, tokenHash),
        eq(userTokens.purpose, purpose),
        // A placeholder for an address held in another network never joins through a link.
        eq(users.heldElsewhere, false),
      ),
    )
    .limit(1);
  const [row] = options.lock ? await query.for("update", { of: userTokens }) : await query;
  return row ?? null;
}

export async function markTokenUsed(tx: DbOrTx, tokenId: string): Promise<void> {
  await tx.update(userTokens).set({ usedAt: new Date() }).where(eq(userTokens.id, tokenId));
}

export async function setPasswordHash(
  tx: DbOrTx,
  userId: string,
  passwordHash: string,
): Promise<void> {
  await tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, userId));
}

export async function findPasswordHash(tx: DbOrTx, userId: string): Promise<string | null> {
  const [row] = await tx
    .select({ hash: users.passwordHash })
    .from(users)
    .where(eq(users.id, userId));
  return row?.hash ?? null;
}

export async function findActiveUserByEmail(
  tx: DbOrTx,
  email: string,
): Promise<{ id: string; name: string; email: string } | null> {
  const [row] = await tx
    .select({
      id: users.id,
      name: users.displayName,
      email: users.email,
      deactivatedAt: users.deactivatedAt,
      hasPassword: sql<boolean>`${users.passwordHash} is not null`,
    })
    .from(users)
    .where(accountWithAddress(email))
    .limit(1);
  if (!row || row.deactivatedAt !== null || !row.hasPassword) return null;
  return { id: row.id, name: row.name, email: row.email };
}

export async function updateDisplayName(
  tx: DbOrTx,
  userId: string,
  name: string,
): Promise<{ before: string }> {
  const [current] = await tx
    .select({ name: users.displayName })
    .from(users)
    .where(eq(users.id, userId))
    .for("update");
  await tx
    .update(users)
    .set({ displayName: name, updatedAt: new Date() })
    .where(eq(users.id, userId));
  return { before: current!.name };
}
