import { cn } from "@/lib/cn";

import { useSyncStatus } from "../hooks/use-sync-status";
import type { SyncStatus } from "../lib/sync-queue";

type Tone = "saved" | "waiting" | "offline" | "problem";

export function describeSync(status: SyncStatus): { text: string; tone: Tone } {
  const changes = (count: number) => `${count} ${count === 1 ? "change" : "changes"}`;
  if (!status.online) {
    return status.waiting > 0
      ? {
          text: `Offline — ${changes(status.waiting)} saved on this phone only, sent when there is signal`,
          tone: "offline",
        }
      : { text: "Offline — changes are kept on this phone", tone: "offline" };
  }
  if (status.signedOut && status.waiting > 0) {
    return {
      text: `Signed out — ${changes(status.waiting)} kept on this phone until you sign in again`,
      tone: "problem",
    };
  }
  if (status.waiting > 0 && status.away) {
    const who =
      status.away === "database" ? "Lintel cannot reach its database" : "Lintel is not answering";
    return {
      text: `${who} — ${changes(status.waiting)} kept on this phone, sent when it is back`,
      tone: "offline",
    };
  }
  if (status.waiting > 0) {
    return {
      text: `${changes(status.waiting)} saved on this phone only — sending to Lintel`,
      tone: "waiting",
    };
  }
  if (status.held > 0) {
    return {
      text: `${changes(status.held)} not accepted — open the audit to see why`,
      tone: "problem",
    };
  }
  return { text: "All changes arrived in Lintel", tone: "saved" };
}

const toneStyles: Record<Tone, string> = {
  saved: "border-verdict-ready/40 bg-verdict-ready/10 text-verdict-ready",
  waiting: "border-brand-200 bg-brand-50 text-brand-800",
  offline: "border-ink-subtle/40 bg-surface-sunken text-ink",
  problem: "border-verdict-not-ready/40 bg-verdict-not-ready/10 text-verdict-not-ready",
};

function ToneIcon({ tone }: { tone: Tone }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 20 20"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.8"
      strokeLinecap="round"
      strokeLinejoin="round"
      className="size-4 shrink-0"
    >
      {tone === "saved" ? (
        <path d="m5 10.5 3.2 3.2L15 6.8" />
      ) : tone === "waiting" ? (
        <>
          <path d="M16 10a6 6 0 1 1-1.8-4.3" />
          <path d="M16 3.5v3h-3" />
        </>
      ) : tone === "offline" ? (
        <>
          <path d="M2.5 7.5a11 11 0 0 1 15 0M5 10.5a7 7 0 0 1 10 0M7.6 13.4a3 3 0 0 1 4.8 0" />
          <path d="m3 3 14 14" />
        </>
      ) : (
        <>
          <circle cx="10" cy="10" r="7.5" />
          <path d="M10 6v4.5M10 13.6v.1" />
        </>
      )}
    </svg>
  );
}

export interface SyncStatusNoteProps {
  className?: string;
  /** Say nothing when all is saved (pages other than the audit itself). */
  quietWhenSaved?: boolean;
}

/** How the phone's audit changes stand against the server, announced politely as it changes. */
export function SyncStatusNote({ className, quietWhenSaved = false }: SyncStatusNoteProps) {
  const status = useSyncStatus();
  if (!status) return null;
  const { text, tone } = describeSync(status);
  if (quietWhenSaved && tone === "saved") return null;
  return (
    <p
      role="status"
      className={cn(
        "inline-flex min-h-8 items-center gap-1.5 rounded-full border px-3 py-1 text-sm font-semibold",
        toneStyles[tone],
        className,
      )}
    >
      <ToneIcon tone={tone} />
      {text}
    </p>
  );
}
