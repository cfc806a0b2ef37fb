import type { MeResponse } from "@shared/schemas/auth";
import { onlineManager, type QueryClient } from "@tanstack/react-query";
import { useEffect } from "react";

const submittedDelayMs = 2_000;
const afterFirstPaintMs = 1_500;

// Loaded apart from the first screen, like the audit store.
const keptData = () => import("./kept-data");

/**
 * On any signed-in page: put back what the phone keeps for its person, ask the browser for
 * persistent storage, and keep it fresh while online (once the page has settled, when the
 * connection returns, after a submitted audit; at most every few minutes otherwise).
 */
export function useKeptForOffline(queryClient: QueryClient, me: MeResponse | null): void {
  useEffect(() => {
    if (typeof indexedDB === "undefined") return;
    let live = true;
    let timer: ReturnType<typeof setTimeout> | undefined;
    void keptData().then((module) => {
      if (live) void module.restoreKept(queryClient);
    });
    if (!me) {
      return () => {
        live = false;
      };
    }
    const keep = (force = false) => {
      void keptData().then((module) => {
        if (live) void module.keepForOffline(queryClient, me, { force });
      });
    };
    timer = setTimeout(() => {
      void keptData().then((module) => module.askForPersistentStorage());
      keep();
    }, afterFirstPaintMs);
    const unsubscribeOnline = onlineManager.subscribe((online) => {
      if (online) keep();
    });
    let stopHearing = () => {};
    void import("@/features/walkthroughs/lib/audit-device").then((module) => {
      if (!live) return;
      stopHearing = module.onAuditSubmitted(() => {
        clearTimeout(timer);
        timer = setTimeout(() => keep(true), submittedDelayMs);
      });
    });
    return () => {
      live = false;
      clearTimeout(timer);
      unsubscribeOnline();
      stopHearing();
    };
  }, [queryClient, me]);
}
