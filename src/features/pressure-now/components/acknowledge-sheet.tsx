import { maxAcknowledgementNoteLength } from "@shared/schemas/pressure-site";
import { useEffect, useId, useState } from "react";

import { Button } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/text-area-field";
import { isApiError } from "@/lib/api-client";

import { useAcknowledgeAlarm } from "../api/acknowledge-alarm";

export interface AcknowledgeSheetProps {
  siteId: string;
  alarmId: string;
  /** "Room 2.14, Wexley — not negative for 6 min, worst +1.2 Pa". */
  summary: string;
  onClose: () => void;
}

/**
 * A sheet from the bottom of the phone: what was seen or done, then Acknowledge. The note is
 * required (the server says so too); a refusal is shown beside the field, never lost.
 */
export function AcknowledgeSheet({ siteId, alarmId, summary, onClose }: AcknowledgeSheetProps) {
  const headingId = useId();
  const [note, setNote] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const acknowledge = useAcknowledgeAlarm(siteId);

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.key === "Escape") onClose();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [onClose]);

  return (
    <div className="fixed inset-0 z-50 flex items-end justify-center bg-ink/40 md:items-center">
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby={headingId}
        className="w-full max-w-lg rounded-t-2xl bg-surface p-4 shadow-lg md:rounded-2xl"
      >
        <h2 id={headingId} className="text-lg font-semibold">
          Acknowledge the alarm
        </h2>
        <p className="mt-1 text-sm text-ink-muted">{summary}</p>
        <form
          className="mt-3 flex flex-col gap-3"
          onSubmit={(event) => {
            event.preventDefault();
            const trimmed = note.trim();
            if (trimmed.length === 0) {
              setProblem("Say what was done or seen: a note is required.");
              return;
            }
            setProblem(null);
            acknowledge.mutate(
              { alarmId, note: trimmed },
              {
                onSuccess: onClose,
                onError: (error) =>
                  setProblem(
                    isApiError(error) ? (error.fieldError("note") ?? error.message) : error.message,
                  ),
              },
            );
          }}
        >
          <TextAreaField
            label="Note"
            hint="What you saw or did, e.g. door was propped open, closed it."
            value={note}
            maxLength={maxAcknowledgementNoteLength}
            error={problem ?? undefined}
            autoFocus
            onChange={(event) => setNote(event.target.value)}
          />
          <div className="flex flex-wrap gap-2">
            <Button type="submit" disabled={acknowledge.isPending}>
              {acknowledge.isPending ? "Acknowledging…" : "Acknowledge"}
            </Button>
            <Button variant="secondary" onClick={onClose}>
              Cancel
            </Button>
          </div>
        </form>
      </div>
    </div>
  );
}
