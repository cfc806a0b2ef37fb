import type { ReactNode } from "react";

import { cn } from "@/lib/cn";

export interface EmptyStateProps {
  title: string;
  description?: ReactNode;
  /** A button or link that gets the person unstuck. */
  action?: ReactNode;
  /** Heading level, to keep the page outline in order. */
  headingLevel?: 1 | 2 | 3;
  className?: string;
}

export function EmptyState({
  title,
  description,
  action,
  headingLevel = 2,
  className,
}: EmptyStateProps) {
  const Heading = (["h1", "h2", "h3"] as const)[headingLevel - 1] ?? "h2";
  return (
    <div
      className={cn(
        "flex flex-col items-center gap-3 rounded-card border border-dashed border-surface-line bg-surface-sunken px-6 py-10 text-center",
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 48 48" className="size-12 text-brand-400">
        <path d="M8 14h32v5H8z" fill="currentColor" />
        <path d="M12 19h5v20h-5zM31 19h5v20h-5z" fill="currentColor" opacity="0.55" />
        <path d="M6 40h36" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <Heading className={cn("font-semibold text-ink", headingLevel === 1 ? "text-xl" : "text-lg")}>
        {title}
      </Heading>
      {description ? <div className="max-w-prose text-ink-muted">{description}</div> : null}
      {action ? <div className="mt-2">{action}</div> : null}
    </div>
  );
}
