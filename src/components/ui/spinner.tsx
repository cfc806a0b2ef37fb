import { cn } from "@/lib/cn";

/** The spinning ring alone, hidden from screen readers: for use inside a labelled control. */
export function SpinnerGlyph({ className }: { className?: string }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 24 24"
      className={cn("size-6 shrink-0 animate-spin motion-reduce:animate-none", className)}
    >
      <circle
        cx="12"
        cy="12"
        r="9"
        fill="none"
        stroke="currentColor"
        strokeOpacity="0.25"
        strokeWidth="3"
      />
      <path
        d="M21 12a9 9 0 0 0-9-9"
        fill="none"
        stroke="currentColor"
        strokeWidth="3"
        strokeLinecap="round"
      />
    </svg>
  );
}

export interface SpinnerProps {
  /** Read by screen readers; shown beside the ring unless `hideLabel` is set. */
  label?: string;
  hideLabel?: boolean;
  className?: string;
}

export function Spinner({ label = "Loading…", hideLabel = false, className }: SpinnerProps) {
  return (
    <div role="status" className={cn("flex items-center gap-3 text-ink-muted", className)}>
      <SpinnerGlyph />
      <span className={cn(hideLabel && "sr-only")}>{label}</span>
    </div>
  );
}

/** A spinner centred in the space a page would take, for whole-page waits. */
export function PageSpinner({ label }: { label?: string }) {
  return (
    <div className="flex min-h-[50vh] items-center justify-center p-6">
      <Spinner label={label} />
    </div>
  );
}
