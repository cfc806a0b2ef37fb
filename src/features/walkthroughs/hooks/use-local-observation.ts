import { useEffect, useState } from "react";

import { auditDevice, hasOfflineStorage } from "../lib/audit-device";
import type { LocalObservation, QueuedChange } from "../lib/offline-store";

export type LocalObservationState =
  | { status: "loading" }
  | { status: "absent" }
  | { status: "ready"; observation: LocalObservation; changes: readonly QueuedChange[] };

/** The observation as this phone keeps it, read again after every change to the store. */
export function useLocalObservation(observationId: string): LocalObservationState {
  const [state, setState] = useState<LocalObservationState>(() =>
    hasOfflineStorage() ? { status: "loading" } : { status: "absent" },
  );
  useEffect(() => {
    if (!hasOfflineStorage()) return;
    let live = true;
    let reads = 0;
    let unsubscribe = () => {};
    auditDevice().then(
      ({ store }) => {
        if (!live) return;
        const read = () => {
          const ticket = ++reads;
          void Promise.all([
            store.getObservation(observationId),
            store.changesForAudit(observationId),
          ]).then(
            ([observation, changes]) => {
              if (!live || ticket !== reads) return;
              setState(
                observation ? { status: "ready", observation, changes } : { status: "absent" },
              );
            },
            () => undefined,
          );
        };
        unsubscribe = store.subscribe(read);
        read();
      },
      () => {
        if (live) setState({ status: "absent" });
      },
    );
    return () => {
      live = false;
      unsubscribe();
    };
  }, [observationId]);
  return state;
}
