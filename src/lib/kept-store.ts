import type { DehydratedState } from "@tanstack/react-query";
import { type DBSchema, deleteDB, type IDBPDatabase, openDB } from "idb";

import { personDatabases } from "./phone-person";

/**
 * What the phone keeps of Lintel for the person signed in, so their due list, floors, spaces,
 * checklists and floor plans open with no signal: in their own database, deleted when they sign out.
 * Lists are kept as the query cache's own dehydrated state; plan images as blobs.
 */

export interface KeptQueries {
  key: "queries";
  /** When Lintel last answered for all of it. */
  keptAt: string;
  state: DehydratedState;
  /** Size of the kept lists as JSON, in bytes. */
  bytes: number;
}

export interface KeptImage {
  imageId: string;
  blob: Blob;
  bytes: number;
  keptAt: string;
}

interface KeptDb extends DBSchema {
  meta: { key: string; value: KeptQueries };
  images: { key: string; value: KeptImage };
}

export interface KeptSummary {
  keptAt: string | null;
  listBytes: number;
  images: number;
  imageBytes: number;
}

const open = (personId: string): Promise<IDBPDatabase<KeptDb>> =>
  openDB<KeptDb>(personDatabases.kept(personId), 1, {
    upgrade(db) {
      db.createObjectStore("meta", { keyPath: "key" });
      db.createObjectStore("images", { keyPath: "imageId" });
    },
    // Being deleted (sign-out in another tab): let go.
    blocking(_current, _blocked, event) {
      (event.target as IDBDatabase).close();
    },
  });

async function withKept<T>(personId: string, work: (db: IDBPDatabase<KeptDb>) => Promise<T>) {
  const db = await open(personId);
  try {
    return await work(db);
  } finally {
    db.close();
  }
}

export function hasKeptStorage(): boolean {
  return typeof indexedDB !== "undefined";
}

export function saveKeptQueries(personId: string, state: DehydratedState, now: Date) {
  const bytes = new Blob([JSON.stringify(state)]).size;
  return withKept(personId, (db) =>
    db.put("meta", { key: "queries", keptAt: now.toISOString(), state, bytes }),
  );
}

export function readKeptQueries(personId: string): Promise<KeptQueries | undefined> {
  return withKept(personId, (db) => db.get("meta", "queries"));
}

export function keptImageIds(personId: string): Promise<string[]> {
  return withKept(personId, (db) => db.getAllKeys("images"));
}

export function readKeptImage(personId: string, imageId: string): Promise<KeptImage | undefined> {
  return withKept(personId, (db) => db.get("images", imageId));
}

/** Keeps these images, and lets go of every other one. */
export function keepImages(personId: string, images: readonly KeptImage[], wanted: Set<string>) {
  return withKept(personId, async (db) => {
    const tx = db.transaction("images", "readwrite");
    for (const image of images) await tx.store.put(image);
    for (const key of await tx.store.getAllKeys()) {
      if (!wanted.has(key)) await tx.store.delete(key);
    }
    await tx.done;
  });
}

export function keptSummary(personId: string): Promise<KeptSummary> {
  return withKept(personId, async (db) => {
    const [queries, images] = await Promise.all([db.get("meta", "queries"), db.getAll("images")]);
    return {
      keptAt: queries?.keptAt ?? null,
      listBytes: queries?.bytes ?? 0,
      images: images.length,
      imageBytes: images.reduce((sum, image) => sum + image.bytes, 0),
    };
  });
}

/** Signing out: nothing of what was kept for this person stays on the phone. */
export function deleteKept(personId: string): Promise<void> {
  return deleteDB(personDatabases.kept(personId));
}

/** Asks the browser not to clear the phone's stores under storage pressure; says whether it will. */
export async function askForPersistentStorage(): Promise<boolean | null> {
  if (typeof navigator === "undefined" || !navigator.storage?.persist) return null;
  try {
    if (await navigator.storage.persisted()) return true;
    return await navigator.storage.persist();
  } catch {
    return null;
  }
}

export async function persistentStorageGranted(): Promise<boolean | null> {
  if (typeof navigator === "undefined" || !navigator.storage?.persisted) return null;
  try {
    return await navigator.storage.persisted();
  } catch {
    return null;
  }
}
