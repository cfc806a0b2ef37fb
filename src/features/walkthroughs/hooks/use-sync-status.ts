import { useEffect, useState } from "react";

import { auditDevice, hasOfflineStorage } from "../lib/audit-device";
import type { SyncStatus } from "../lib/sync-queue";

/** The sync queue's state, live; null until the phone's store has opened. */
export function useSyncStatus(): SyncStatus | null {
  const [status, setStatus] = useState<SyncStatus | null>(null);
  useEffect(() => {
    if (!hasOfflineStorage()) return;
    let live = true;
    let unsubscribe = () => {};
    auditDevice().then(
      ({ sync }) => {
        if (!live) return;
        setStatus(sync.status());
        unsubscribe = sync.subscribe(setStatus);
      },
      () => undefined,
    );
    return () => {
      live = false;
      unsubscribe();
    };
  }, []);
  return status;
}
