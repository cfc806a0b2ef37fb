import type { Page } from "playwright-core";

export interface KeptOnPhone {
  keptAt: string | null;
  listBytes: number;
  images: number;
  imageBytes: number;
  queries: number;
}

/** What the phone keeps for the person signed in on it, read from their own IndexedDB store. */
export function keptOnPhone(page: Page): Promise<KeptOnPhone | null> {
  return page.evaluate(async () => {
    const personId = localStorage.getItem("lintel:person");
    if (!personId) return null;
    const name = `lintel-kept:${personId}`;
    if (!(await indexedDB.databases()).some((info) => info.name === name)) return null;
    const db = await new Promise<IDBDatabase>((resolve, reject) => {
      const request = indexedDB.open(name);
      request.onsuccess = () => resolve(request.result);
      request.onerror = () => reject(request.error);
    });
    const read = <T>(store: string, op: (s: IDBObjectStore) => IDBRequest<T>) =>
      new Promise<T>((resolve, reject) => {
        const request = op(db.transaction(store).objectStore(store));
        request.onsuccess = () => resolve(request.result);
        request.onerror = () => reject(request.error);
      });
    try {
      if (!db.objectStoreNames.contains("meta")) return null;
      const meta = await read<
        { keptAt: string; bytes: number; state: { queries: unknown[] } } | undefined
      >("meta", (s) => s.get("queries"));
      const images = await read<{ bytes: number }[]>("images", (s) => s.getAll());
      return {
        keptAt: meta?.keptAt ?? null,
        listBytes: meta?.bytes ?? 0,
        queries: meta?.state.queries.length ?? 0,
        images: images.length,
        imageBytes: images.reduce((sum, image) => sum + image.bytes, 0),
      };
    } finally {
      db.close();
    }
  });
}

/** Waits until the phone has kept its person's lists (after an online sign-in). */
export async function waitForKept(page: Page, timeoutMs = 30_000): Promise<KeptOnPhone> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const kept = await keptOnPhone(page);
    if (kept?.keptAt) return kept;
    if (Date.now() > deadline) throw new Error("the phone kept nothing for working offline");
    await page.waitForTimeout(250);
  }
}
