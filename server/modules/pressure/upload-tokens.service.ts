import { createHash, randomBytes } from "node:crypto";

import {
  uploadTokenPrefix,
  type CreatedUploadToken,
  type UploadToken,
} from "@shared/schemas/pressure-uploads";

import type { Database } from "../../db/client";
import { notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import * as repo from "./upload-tokens.repository";

/** Only this is stored: a token is 32 random bytes, so a plain SHA-256 is enough to look it up. */
export const hashUploadToken = (token: string): string =>
  createHash("sha256").update(token, "utf8").digest("hex");

export const listUploadTokens = (db: Database, siteId: string): Promise<UploadToken[]> =>
  repo.listTokens(db, siteId);

/** Makes a token for the site; the reply carries the token this once. */
export function createUploadToken(
  db: Database,
  siteId: string,
  name: string,
  actor: Actor & { userId: string },
): Promise<CreatedUploadToken> {
  const secret = `${uploadTokenPrefix}${randomBytes(32).toString("base64url")}`;
  return db.transaction(async (tx) => {
    const id = await repo.insertToken(tx, {
      siteId,
      name,
      tokenHash: hashUploadToken(secret),
      createdBy: actor.userId,
    });
    await recordChange(tx, actor, {
      action: "pressure_upload_token.created",
      entity: "pressure_upload_token",
      entityId: id,
      siteId,
      after: { name },
    });
    return { token: (await repo.findToken(tx, siteId, id))!, secret };
  });
}

/** Revokes a token; revoking one already revoked changes nothing and answers the same. */
export function revokeUploadToken(
  db: Database,
  siteId: string,
  tokenId: string,
  actor: Actor & { userId: string },
): Promise<UploadToken> {
  return db.transaction(async (tx) => {
    const before = await repo.findToken(tx, siteId, tokenId);
    if (!before) throw notFound("That upload token");
    if (await repo.revokeToken(tx, siteId, tokenId, actor.userId))
      await recordChange(tx, actor, {
        action: "pressure_upload_token.revoked",
        entity: "pressure_upload_token",
        entityId: tokenId,
        siteId,
        before: { name: before.name, revokedAt: null },
        after: { name: before.name, revokedAt: new Date().toISOString() },
      });
    return (await repo.findToken(tx, siteId, tokenId))!;
  });
}
