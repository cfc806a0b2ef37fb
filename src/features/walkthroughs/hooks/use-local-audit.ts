import { useEffect, useState } from "react";

import { auditDevice, hasOfflineStorage } from "../lib/audit-device";
import type {
  AuditStore,
  LocalAnswer,
  LocalAudit,
  LocalPhoto,
  QueuedChange,
} from "../lib/offline-store";

export interface LocalAuditSnapshot {
  audit: LocalAudit;
  answers: ReadonlyMap<string, LocalAnswer>;
  photos: readonly LocalPhoto[];
  /** This audit's changes still waiting (or held) in the queue. */
  changes: readonly QueuedChange[];
}

export type LocalAuditState =
  | { status: "loading" }
  /** Not on this phone (or the browser keeps no storage): look on the server. */
  | { status: "absent" }
  | { status: "ready"; snapshot: LocalAuditSnapshot };

/**
 * Reads from the phone's store now and after every change to it, until the component goes.
 * Reads that finish after that are dropped, and so are their failures (the store may be closing).
 */
function useStoreReader<T>(read: (store: AuditStore) => Promise<T>, apply: (value: T) => void) {
  useEffect(() => {
    if (!hasOfflineStorage()) return;
    let live = true;
    let reads = 0;
    let unsubscribe = () => {};
    const run = (store: AuditStore) => {
      const ticket = ++reads;
      read(store).then(
        (value) => {
          // A later read has started: this one is already out of date.
          if (live && ticket === reads) apply(value);
        },
        () => undefined,
      );
    };
    auditDevice().then(
      ({ store }) => {
        if (!live) return;
        unsubscribe = store.subscribe(() => run(store));
        run(store);
      },
      () => undefined,
    );
    return () => {
      live = false;
      unsubscribe();
    };
  }, [read, apply]);
}

/** The audit as this phone holds it, read again after every change to the store. */
export function useLocalAudit(auditId: string): LocalAuditState {
  const [state, setState] = useState<LocalAuditState>(() =>
    hasOfflineStorage() ? { status: "loading" } : { status: "absent" },
  );
  const [reader] = useState(() => ({
    read: async (store: AuditStore): Promise<LocalAuditState> => {
      const [audit, answers, photos, changes] = await Promise.all([
        store.getAudit(auditId),
        store.getAnswers(auditId),
        store.getPhotos(auditId),
        store.changesForAudit(auditId),
      ]);
      if (!audit) return { status: "absent" };
      return {
        status: "ready",
        snapshot: {
          audit,
          answers: new Map(answers.map((answer) => [answer.itemId, answer])),
          photos,
          changes,
        },
      };
    },
  }));
  useStoreReader(reader.read, setState);
  return state;
}

/** Audits of a space kept on this phone that the server may not have confirmed yet. */
export function usePhoneAuditsForSpace(spaceId: string): readonly LocalAudit[] {
  const [audits, setAudits] = useState<readonly LocalAudit[]>([]);
  const [reader] = useState(() => ({
    read: async (store: AuditStore) =>
      (await store.auditsForSpace(spaceId)).filter((audit) => audit.state !== "submitted"),
  }));
  useStoreReader(reader.read, setAudits);
  return audits;
}
