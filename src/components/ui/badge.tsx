import type { ReactNode } from "react";

import { cn } from "@/lib/cn";

export type BadgeTone = "neutral" | "positive" | "pending" | "muted";

// Text colours keep AA contrast on their tinted backgrounds; a border keeps the shape visible
// for people who do not tell the tints apart.
const tones: Record<BadgeTone, string> = {
  neutral: "border-brand-200 bg-brand-50 text-brand-800",
  positive: "border-verdict-ready/40 bg-verdict-ready/10 text-verdict-ready",
  pending: "border-verdict-conditions/40 bg-verdict-conditions/10 text-verdict-conditions",
  muted: "border-surface-line bg-surface-sunken text-ink-muted",
};

export interface BadgeProps {
  tone?: BadgeTone;
  className?: string;
  children: ReactNode;
}

export function Badge({ tone = "neutral", className, children }: BadgeProps) {
  return (
    <span
      className={cn(
        "inline-flex items-center rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap",
        tones[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}
