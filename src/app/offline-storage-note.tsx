import { useEffect, useState } from "react";

import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format";
import {
  hasKeptStorage,
  keptSummary,
  type KeptSummary,
  persistentStorageGranted,
} from "@/lib/kept-store";

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** What the phone keeps for working without signal, and whether the browser promised to keep it. */
export function OfflineStorageNote({ personId }: { personId: string }) {
  const [summary, setSummary] = useState<KeptSummary | null>(null);
  const [persisted, setPersisted] = useState<boolean | null>(null);

  useEffect(() => {
    if (!hasKeptStorage()) return;
    let live = true;
    void keptSummary(personId)
      .then((value) => live && setSummary(value))
      .catch(() => undefined);
    void persistentStorageGranted().then((value) => live && setPersisted(value));
    return () => {
      live = false;
    };
  }, [personId]);

  return (
    <Card>
      <h2 className="text-lg font-semibold">Working without signal</h2>
      {summary?.keptAt ? (
        <p className="mt-1">
          This phone keeps your due lists, floors, spaces, checklists and{" "}
          {summary.images === 1 ? "1 floor plan" : `${summary.images} floor plans`} (
          {formatBytes(summary.listBytes + summary.imageBytes)}), last updated from Lintel{" "}
          {formatDateTime(summary.keptAt)}.
        </p>
      ) : (
        <p className="mt-1 text-ink-muted">
          Nothing is kept on this phone yet; it is kept while you are signed in with signal.
        </p>
      )}
      <p className="mt-2 text-sm text-ink-muted">
        {persisted === true
          ? "Kept for good: the browser has agreed not to clear it when the phone runs short of space."
          : persisted === false
            ? "The browser may clear it if the phone runs short of space; audits still waiting are sent first when there is signal."
            : "This browser does not say whether it will keep it."}
      </p>
    </Card>
  );
}
