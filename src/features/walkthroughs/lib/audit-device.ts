import { ApiError } from "@/lib/api-client";
import { onPhonePersonChange, personDatabases, phonePersonId } from "@/lib/phone-person";

import { putObservation } from "../api/put-observation";
import { saveAnswer } from "../api/save-answer";
import { startAudit } from "../api/start-audit";
import { submitAudit } from "../api/submit-audit";
import { uploadAuditPhoto } from "../api/upload-audit-photo";
import { deleteDB } from "idb";

import { type AuditStore, openAuditStore } from "./offline-store";
import {
  createSyncScheduler,
  type SubmittedListener,
  type SyncScheduler,
  type SyncTransport,
} from "./sync-queue";

/**
 * The phone's audit store of the person signed in here and the queue that empties it into Lintel:
 * one per page. Each person has their own database; another person's is never opened, shown or sent.
 */
export interface AuditDevice {
  personId: string;
  store: AuditStore;
  sync: SyncScheduler;
}

export class NoPersonOnPhoneError extends Error {
  override readonly name = "NoPersonOnPhoneError";
  constructor() {
    super("Nobody is signed in on this phone.");
  }
}

/**
 * The calls, made only while `personId` is still the person signed in on this phone: after a
 * sign-out (or someone else's sign-in) a queue still running stops as if signed out, so one
 * person's changes never go under another's session.
 */
function transportFor(personId: string): SyncTransport {
  const theirs =
    <A extends unknown[], R>(call: (...args: A) => Promise<R>) =>
    (...args: A): Promise<R> => {
      if (phonePersonId() !== personId) {
        return Promise.reject(
          new ApiError({
            status: 401,
            code: "unauthenticated",
            message: "Signed out on this phone.",
          }),
        );
      }
      return call(...args);
    };
  return {
    startAudit: theirs(startAudit),
    saveAnswer: theirs(saveAnswer),
    uploadPhoto: theirs(uploadAuditPhoto),
    submitAudit: theirs(submitAudit),
    putObservation: theirs(putObservation),
  };
}

type OpenDevice = AuditDevice & { detach: () => void };

let opening: Promise<OpenDevice> | null = null;
let openFor: string | null = null;
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

/**
 * Opens the signed-in person's store and starts sending whatever is waiting; later calls share the
 * first. When another person has signed in since, the previous person's store is closed first.
 */
export function auditDevice(): Promise<AuditDevice> {
  const personId = phonePersonId();
  if (!personId) return Promise.reject(new NoPersonOnPhoneError());
  if (opening && openFor !== personId) void closeAuditDevice();
  openFor = personId;
  opening ??= openAuditStore({ name: personDatabases.audits(personId), personId }).then(
    (store) => {
      const sync = createSyncScheduler({
        store,
        transport: transportFor(personId),
        onSubmitted: tellSubmitted,
      });
      const detach = listen(sync);
      void sync.kick();
      return { personId, store, sync, detach };
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
  openFor = null;
  if (!current) return;
  const device = await current.catch(() => null);
  device?.detach();
  device?.sync.stop();
  device?.store.close();
}

// Someone else signed in (or the person signed out): the previous person's queue stops at once,
// and nothing on screen goes on reading their store.
onPhonePersonChange((personId) => {
  if (openFor !== null && openFor !== personId) void closeAuditDevice();
});

/** Deletes a person's audit store from the phone (they chose to discard what it held). */
export async function discardAuditStore(personId: string): Promise<void> {
  if (openFor === personId) await closeAuditDevice();
  await deleteDB(personDatabases.audits(personId));
}
