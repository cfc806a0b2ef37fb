import { useEffect } from "react";

/** Starts sending audit changes left waiting on this phone, whatever page is open. */
export function useAuditSyncInBackground(): void {
  useEffect(() => {
    let live = true;
    void import("@/features/walkthroughs/lib/audit-device").then((module) => {
      if (live) module.startAuditSync();
    });
    return () => {
      live = false;
    };
  }, []);
}
