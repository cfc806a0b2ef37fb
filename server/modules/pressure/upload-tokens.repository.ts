import { and, desc, eq, isNull, sql } from "drizzle-orm";

import type { UploadToken } from "@shared/schemas/pressure-uploads";

import type { DbOrTx } from "../../db/client";
import { pressureUploadTokens, users } from "../../db/schema/index";

const columns = {
  id: pressureUploadTokens.id,
  name: pressureUploadTokens.name,
  createdAt: pressureUploadTokens.createdAt,
  createdByName: users.displayName,
  lastUsedAt: pressureUploadTokens.lastUsedAt,
  revokedAt: pressureUploadTokens.revokedAt,
};

type Row = {
  id: string;
  name: string;
  createdAt: Date;
  createdByName: string | null;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
};

const toToken = (row: Row): UploadToken => ({
  ...row,
  createdAt: row.createdAt.toISOString(),
  lastUsedAt: row.lastUsedAt?.toISOString() ?? null,
  revokedAt: row.revokedAt?.toISOString() ?? null,
});

/** A site's tokens, those in use first, newest first; never the hash. */
export async function listTokens(db: DbOrTx, siteId: string): Promise<UploadToken[]> {
  const rows = await db
    .select(columns)
    .from(pressureUploadTokens)
    .leftJoin(users, eq(users.id, pressureUploadTokens.createdBy))
    .where(eq(pressureUploadTokens.siteId, siteId))
    .orderBy(
      sql`${pressureUploadTokens.revokedAt} is not null`,
      desc(pressureUploadTokens.createdAt),
    );
  return rows.map(toToken);
}

export async function findToken(
  db: DbOrTx,
  siteId: string,
  tokenId: string,
): Promise<UploadToken | null> {
  const [row] = await db
    .select(columns)
    .from(pressureUploadTokens)
    .leftJoin(users, eq(users.id, pressureUploadTokens.createdBy))
    .where(and(eq(pressureUploadTokens.siteId, siteId), eq(pressureUploadTokens.id, tokenId)));
  return row ? toToken(row) : null;
}

export async function insertToken(
  db: DbOrTx,
  values: { siteId: string; name: string; tokenHash: string; createdBy: string },
): Promise<string> {
  const [row] = await db
    .insert(pressureUploadTokens)
    .values(values)
    .returning({ id: pressureUploadTokens.id });
  return row!.id;
}

/** Revokes a token still in use; false when it was revoked already. */
export async function revokeToken(
  db: DbOrTx,
  siteId: string,
  tokenId: string,
  userId: string,
): Promise<boolean> {
  const rows = await db
    .update(pressureUploadTokens)
    .set({ revokedAt: new Date(), revokedBy: userId })
    .where(
      and(
        eq(pressureUploadTokens.siteId, siteId),
        eq(pressureUploadTokens.id, tokenId),
        isNull(pressureUploadTokens.revokedAt),
      ),
    )
    .returning({ id: pressureUploadTokens.id });
  return rows.length > 0;
}

/** The site a token in use sends for, by the token's hash; null for an unknown or revoked one. */
export async function findActiveTokenByHash(
  db: DbOrTx,
  tokenHash: string,
): Promise<{ id: string; siteId: string } | null> {
  const [row] = await db
    .select({ id: pressureUploadTokens.id, siteId: pressureUploadTokens.siteId })
    .from(pressureUploadTokens)
    .where(
      and(eq(pressureUploadTokens.tokenHash, tokenHash), isNull(pressureUploadTokens.revokedAt)),
    );
  return row ?? null;
}

export async function markTokenUsed(db: DbOrTx, tokenId: string, at: Date): Promise<void> {
  await db
    .update(pressureUploadTokens)
    .set({ lastUsedAt: at })
    .where(eq(pressureUploadTokens.id, tokenId));
}
