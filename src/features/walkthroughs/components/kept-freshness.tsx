import { onlineManager } from "@tanstack/react-query";
import { useSyncExternalStore } from "react";

import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";

/** Whether the app believes it has a connection, live. */
export function useOnline(): boolean {
  return useSyncExternalStore(
    (listener) => onlineManager.subscribe(listener),
    () => onlineManager.isOnline(),
    () => true,
  );
}

export interface KeptFreshnessProps {
  /** When Lintel last answered for what is shown (ms since the epoch). */
  updatedAt: number;
  /** The last try to reach Lintel failed, though the phone believes it is online. */
  failed?: boolean;
  className?: string;
}

/**
 * Says that a list is shown from what the phone keeps, and how old it is, while Lintel cannot be
 * reached; says nothing otherwise.
 */
export function KeptFreshness({ updatedAt, failed = false, className }: KeptFreshnessProps) {
  const online = useOnline();
  if (online && !failed) return null;
  return (
    <p
      role="status"
      className={cn(
        "rounded-lg border border-ink-subtle/40 bg-surface-sunken px-3 py-2 text-sm",
        className,
      )}
    >
      <span className="font-semibold">{online ? "Lintel cannot be reached" : "No signal"}</span>
      {" — shown from this phone, last updated from Lintel "}
      {updatedAt > 0 ? formatDateTime(new Date(updatedAt).toISOString()) : "earlier"}.
    </p>
  );
}

/** A list that is neither here nor kept, with no signal to fetch it. */
export function NotKeptHere({ what }: { what: string }) {
  return (
    <p className="mt-2 text-ink-muted">
      {what} is not kept on this phone yet. Open it once with signal and it will be.
    </p>
  );
}
