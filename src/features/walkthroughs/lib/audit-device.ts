import { saveAnswer } from "../api/save-answer";
import { startAudit } from "../api/start-audit";
import { submitAudit } from "../api/submit-audit";
import { uploadAuditPhoto } from "../api/upload-audit-photo";
import { type AuditStore, openAuditStore } from "./offline-store";
import {
  createSyncScheduler,
  type SubmittedListener,
  type SyncScheduler,
  type SyncTransport,
} from "./sync-queue";

/** The phone's audit store and the queue that empties it into Lintel: one per page. */
export interface AuditDevice {
  store: AuditStore;
  sync: SyncScheduler;
}

const apiTransport: SyncTransport = {
  startAudit,
  saveAnswer,
  uploadPhoto: uploadAuditPhoto,
  submitAudit,
};

let opening: Promise<AuditDevice> | null = null;
let detachListeners: (() => void) | null = null;
const submittedListeners = new Set<SubmittedListener>();

function tellSubmitted(detail: Parameters<SubmittedListener>[0]) {
  for (const listener of [...submittedListeners]) listener(detail);
}

/**
 * Hears every submission the server accepts from this phone, whichever page sent it; returns the
 * way to stop hearing.
 */
export function onAuditSubmitted(listener: SubmittedListener): () => void {
  submittedListeners.add(listener);
  return () => void submittedListeners.delete(listener);
}

export function hasOfflineStorage(): boolean {
  return typeof indexedDB !== "undefined";
}

// A connection that has just come back is often not usable for a moment yet.
const settleMs = 1_000;

function listen(sync: SyncScheduler): () => void {
  let settling: ReturnType<typeof setTimeout> | undefined;
  const online = () => {
    sync.connectionChanged();
    clearTimeout(settling);
    settling = setTimeout(() => void sync.reconnected(), settleMs);
  };
  const offline = () => {
    clearTimeout(settling);
    sync.connectionChanged();
  };
  const visible = () => {
    if (document.visibilityState === "visible") void sync.kick();
  };
  window.addEventListener("online", online);
  window.addEventListener("offline", offline);
  document.addEventListener("visibilitychange", visible);
  return () => {
    clearTimeout(settling);
    window.removeEventListener("online", online);
    window.removeEventListener("offline", offline);
    document.removeEventListener("visibilitychange", visible);
  };
}

/** Opens the store and starts sending whatever is waiting; later calls share the first. */
export function auditDevice(): Promise<AuditDevice> {
  opening ??= openAuditStore().then(
    (store) => {
      const sync = createSyncScheduler({
        store,
        transport: apiTransport,
        onSubmitted: tellSubmitted,
      });
      detachListeners = listen(sync);
      void sync.kick();
      return { store, sync };
    },
    (error: unknown) => {
      // Let a later call try again (storage can be briefly unavailable, e.g. during an upgrade).
      opening = null;
      throw error;
    },
  );
  return opening;
}

/** Starts the background sync on any signed-in page, so changes left waiting still go. */
export function startAuditSync(): void {
  if (hasOfflineStorage()) void auditDevice().catch(() => undefined);
}

/** Stops sending and closes the store (between tests, or before the store is deleted). */
export async function closeAuditDevice(): Promise<void> {
  const current = opening;
  opening = null;
  if (!current) return;
  const device = await current.catch(() => null);
  detachListeners?.();
  detachListeners = null;
  device?.sync.stop();
  device?.store.close();
}
