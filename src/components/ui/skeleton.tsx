import { cn } from "@/lib/cn";

import { SpinnerGlyph } from "./spinner";

export interface PageSkeletonProps {
  /** Read by screen readers and shown beside the ring. */
  label?: string;
  /** Heights of the grey blocks standing in for the page's sections, in rem. */
  blocks?: readonly number[];
  className?: string;
}

/**
 * The space a page's sections will take while they load, as one piece: it is replaced whole, so
 * nothing that was on the screen moves when the answers arrive.
 */
export function PageSkeleton({
  label = "Loading…",
  blocks = [9, 14, 14],
  className,
}: PageSkeletonProps) {
  return (
    <div role="status" className={cn("flex flex-col gap-6", className)}>
      <p className="flex items-center gap-3 text-ink-muted">
        <SpinnerGlyph />
        <span>{label}</span>
      </p>
      {blocks.map((height, index) => (
        <div
          key={index}
          aria-hidden="true"
          style={{ height: `${height}rem` }}
          className="rounded-card border border-surface-line bg-surface motion-safe:animate-pulse"
        />
      ))}
    </div>
  );
}
