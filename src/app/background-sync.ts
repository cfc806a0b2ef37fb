import { useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";

import { invalidateAfterAuditChange } from "@/lib/audit-change";

/**
 * Starts sending audit changes left waiting on this phone, whatever page is open, and once the
 * server accepts a submission, fetches again what it changed: actions, due lists, figures.
 */
export function useAuditSyncInBackground(): void {
  const queryClient = useQueryClient();
  useEffect(() => {
    let live = true;
    let stopHearing = () => {};
    void import("@/features/walkthroughs/lib/audit-device").then((module) => {
      if (!live) return;
      stopHearing = module.onAuditSubmitted(
        (detail) => void invalidateAfterAuditChange(queryClient, detail.audit),
      );
      module.startAuditSync();
    });
    return () => {
      live = false;
      stopHearing();
    };
  }, [queryClient]);
}
