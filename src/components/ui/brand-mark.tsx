import { cn } from "@/lib/cn";

export interface BrandMarkProps {
  className?: string;
}

/** Lintel's mark: a doorway whose beam spans two posts, the way every audit starts at a door. */
export function BrandMark({ className }: BrandMarkProps) {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className={cn("size-8 shrink-0", className)}>
      <rect width="32" height="32" rx="8" fill="#1a4a4d" />
      <rect x="5" y="7" width="22" height="5" rx="1.5" fill="#e9a877" />
      <rect x="8.5" y="12" width="4" height="14" rx="1" fill="#ffffff" />
      <rect x="19.5" y="12" width="4" height="14" rx="1" fill="#ffffff" />
    </svg>
  );
}

export function BrandName({ className }: { className?: string }) {
  return (
    <span className={cn("flex items-center gap-2.5 text-xl font-bold tracking-tight", className)}>
      <BrandMark />
      Lintel
    </span>
  );
}
