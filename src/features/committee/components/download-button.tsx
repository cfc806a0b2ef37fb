import { useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { isApiError } from "@/lib/api-client";

import { bytesText, countText } from "../lib/committee-format";
import {
  type DownloadedFile,
  type DownloadOptions,
  type DownloadProgress,
  saveFile,
} from "../lib/download-file";

type State =
  | { kind: "idle" }
  | { kind: "running"; progress: DownloadProgress }
  | { kind: "saved"; name: string; bytes: number; rows: number | null }
  | { kind: "failed"; message: string };

export interface DownloadButtonProps {
  /** The button's words, e.g. "Download the audits (CSV)". */
  label: string;
  /** What is being fetched, for the progress bar's name: "the audits (CSV)". */
  what: string;
  /** CSV files count their rows as they arrive (less the header line). */
  countsRows?: boolean;
  download: (options: DownloadOptions) => Promise<DownloadedFile>;
}

function percentOf(progress: DownloadProgress): number | null {
  if (progress.total === null) return null;
  return Math.min(100, Math.round((progress.received / progress.total) * 100));
}

function progressText(progress: DownloadProgress, countsRows: boolean): string {
  const percent = percentOf(progress);
  if (percent !== null) {
    return `${percent}% (${bytesText(progress.received)} of ${bytesText(progress.total!)})`;
  }
  const rows = countsRows ? `, ${countText(Math.max(0, progress.lines - 1), "row", "rows")}` : "";
  return `${bytesText(progress.received)} received${rows}`;
}

/**
 * Downloads a file through fetch so the page can show how far it has got (a percentage when the
 * server sends the size, bytes and rows when it streams), then saves it under the server's name.
 */
export function DownloadButton({ label, what, countsRows = false, download }: DownloadButtonProps) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const controller = useRef<AbortController | null>(null);

  const start = async () => {
    const abort = new AbortController();
    controller.current = abort;
    setState({ kind: "running", progress: { received: 0, total: null, lines: 0 } });
    try {
      const file = await download({
        signal: abort.signal,
        onProgress: (progress) => setState({ kind: "running", progress }),
      });
      saveFile(file.blob, file.name);
      setState({
        kind: "saved",
        name: file.name,
        bytes: file.bytes,
        rows: countsRows ? Math.max(0, file.lines - 1) : null,
      });
    } catch (error) {
      if (abort.signal.aborted) {
        setState({ kind: "idle" });
        return;
      }
      setState({
        kind: "failed",
        message: isApiError(error)
          ? error.message
          : "The download stopped before it finished. Please try again.",
      });
    } finally {
      if (controller.current === abort) controller.current = null;
    }
  };

  const running = state.kind === "running";
  const percent = running ? percentOf(state.progress) : null;

  return (
    <div className="flex flex-col gap-2">
      <Button variant="secondary" onClick={() => void start()} disabled={running}>
        {label}
      </Button>
      {running ? (
        <div className="flex flex-col gap-1.5">
          <div
            role="progressbar"
            aria-label={`Downloading ${what}`}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={percent ?? undefined}
            aria-valuetext={progressText(state.progress, countsRows)}
            className="h-2.5 overflow-hidden rounded-full bg-surface-sunken ring-1 ring-surface-line"
          >
            <div
              className={
                percent === null
                  ? "h-full w-1/3 animate-pulse rounded-full bg-brand-600 motion-reduce:animate-none"
                  : "h-full rounded-full bg-brand-600 transition-[width]"
              }
              style={percent === null ? undefined : { width: `${percent}%` }}
            />
          </div>
          <div className="flex items-center justify-between gap-2 text-sm text-ink-muted">
            <span>{progressText(state.progress, countsRows)}</span>
            <Button variant="quiet" onClick={() => controller.current?.abort()}>
              Cancel
            </Button>
          </div>
        </div>
      ) : null}
      <p role="status" className="text-sm font-semibold text-verdict-ready empty:hidden">
        {state.kind === "saved"
          ? `Saved ${state.name} (${bytesText(state.bytes)}${state.rows === null ? "" : `, ${countText(state.rows, "row", "rows")}`}).`
          : null}
      </p>
      {state.kind === "failed" ? (
        <Alert role="alert" tone="error" title={`Could not download ${what}`}>
          <p>{state.message}</p>
        </Alert>
      ) : null}
    </div>
  );
}
