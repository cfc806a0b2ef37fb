import { createHash, randomUUID } from "node:crypto";

import sharp from "sharp";

import type { UploadedImage } from "@shared/schemas/floors";

import type { DbOrTx } from "../db/client";
import { AppError } from "./app-error";
import type { Storage } from "./storage";
import {
  clearPendingObjects,
  findImageBySha,
  insertImage,
  notePendingObjects,
  stalePendingObjects,
} from "./images.repository";

// Every image upload in Lintel goes through this module: read → decode → clean → store → record.

const acceptedFormats = new Set(["jpeg", "png", "webp"]);
const unsupported = (field: string) =>
  new AppError(
    "unsupported_media_type",
    415,
    "Send a JPEG, PNG or WebP image. Other files, HEIC photos included, are not accepted.",
    {
      fields: { [field]: "Send a JPEG, PNG or WebP image." },
    },
  );

/** The fingerprint an image is known by: SHA-256 of the bytes as uploaded, hex. */
export function sha256Of(buffer: Buffer): string {
  return createHash("sha256").update(buffer).digest("hex");
}

export interface ProcessedImage {
  sha256: string;
  originalBytes: number;
  display: { data: Buffer; width: number; height: number };
  thumb: { data: Buffer };
}

/**
 * Decodes by content (never by name or declared type), applies the orientation, drops every piece
 * of metadata (EXIF with GPS, ICC, XMP: sharp writes none unless asked), caps the long side and
 * makes a thumbnail.
 */
export async function processImage(
  input: Buffer,
  options: { field: string; maxSide: number },
): Promise<ProcessedImage> {
  let format: string | undefined;
  try {
    format = (await sharp(input, { limitInputPixels: 120_000_000 }).metadata()).format;
  } catch {
    throw unsupported(options.field);
  }
  if (!format || !acceptedFormats.has(format)) throw unsupported(options.field);

  try {
    const display = await sharp(input, { limitInputPixels: 120_000_000 })
      .rotate()
      .resize({
        width: options.maxSide,
        height: options.maxSide,
        fit: "inside",
        withoutEnlargement: true,
      })
      .webp({ quality: 85 })
      .toBuffer({ resolveWithObject: true });
    const thumb = await sharp(display.data)
      .resize({ width: 400, height: 400, fit: "inside", withoutEnlargement: true })
      .webp({ quality: 75 })
      .toBuffer();
    return {
      sha256: sha256Of(input),
      originalBytes: input.length,
      display: { data: display.data, width: display.info.width, height: display.info.height },
      thumb: { data: thumb },
    };
  } catch {
    throw new AppError("unsupported_media_type", 415, "The image is damaged or cannot be read.", {
      fields: { [options.field]: "The image is damaged or cannot be read." },
    });
  }
}

/**
 * Stores the image for a site. The object keys are noted as pending before anything is written;
 * the image row and the clearing of that note commit together. After any failure the objects are
 * removed at once, or — if the store is unreachable — later by `reconcileStorage`, so there is
 * never a row without its objects nor an object without its row. The same bytes at the same site
 * are stored once.
 */
export async function storeImage(
  deps: { db: DbOrTx; storage: Storage },
  input: {
    siteId: string;
    uploadedBy: string | null;
    buffer: Buffer;
    field: string;
    maxSide?: number;
  },
): Promise<UploadedImage> {
  const processed = await processImage(input.buffer, {
    field: input.field,
    maxSide: input.maxSide ?? 2400,
  });
  const existing = await findImageBySha(deps.db, input.siteId, processed.sha256);
  if (existing) return { ...existing, duplicate: true };

  const stem = `sites/${input.siteId}/images/${randomUUID()}`;
  const keys = [`${stem}/display.webp`, `${stem}/thumb.webp`];
  const discard = async () => {
    const removed = await Promise.allSettled(keys.map((key) => deps.storage.remove(key)));
    if (removed.every((result) => result.status === "fulfilled"))
      await clearPendingObjects(deps.db, keys);
  };

  await notePendingObjects(deps.db, keys);
  try {
    await deps.storage.put(keys[0]!, processed.display.data, "image/webp");
    await deps.storage.put(keys[1]!, processed.thumb.data, "image/webp");
    const row = await deps.db.transaction(async (tx) => {
      const inserted = await insertImage(tx, {
        siteId: input.siteId,
        sha256: processed.sha256,
        displayKey: keys[0]!,
        thumbKey: keys[1]!,
        contentType: "image/webp",
        width: processed.display.width,
        height: processed.display.height,
        bytes: processed.display.data.length,
        originalBytes: processed.originalBytes,
        uploadedBy: input.uploadedBy,
      });
      if (inserted) await clearPendingObjects(tx, keys);
      return inserted;
    });
    if (!row) {
      // The same picture was stored at this site a moment ago: keep that one.
      await discard();
      const winner = await findImageBySha(deps.db, input.siteId, processed.sha256);
      return { ...winner!, duplicate: true };
    }
    return { ...row, duplicate: false };
  } catch (error) {
    await discard().catch(() => undefined);
    throw error;
  }
}

/**
 * Deletes objects whose upload never completed (store down during clean-up, process stopped).
 * Only entries older than `olderThanMs` are touched, so uploads in flight are left alone.
 */
export async function reconcileStorage(
  deps: { db: DbOrTx; storage: Storage },
  olderThanMs = 10 * 60 * 1000,
): Promise<number> {
  const keys = await stalePendingObjects(deps.db, new Date(Date.now() - olderThanMs));
  let removed = 0;
  for (const key of keys) {
    try {
      await deps.storage.remove(key);
      await clearPendingObjects(deps.db, [key]);
      removed += 1;
    } catch {
      // Still unreachable: the next round tries again.
    }
  }
  return removed;
}
