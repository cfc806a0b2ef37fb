import { cautionText } from "@shared/cautions";

import { cn } from "@/lib/cn";

export interface CautionNoteProps {
  className?: string;
}

/** The product's standing caution, shown wherever readings and verdicts appear. */
export function CautionNote({ className }: CautionNoteProps) {
  return (
    <aside
      aria-label="Caution"
      className={cn(
        "flex gap-3 rounded-lg border border-clay-100 bg-clay-50 px-4 py-3 text-sm leading-relaxed text-ink",
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 20 20" className="mt-0.5 size-5 shrink-0 text-clay-600">
        <path
          fill="currentColor"
          d="M10 1.8 19 17.5H1L10 1.8Zm-.9 6v5h1.8v-5H9.1Zm.9 6.4a1.1 1.1 0 1 0 0 2.2 1.1 1.1 0 0 0 0-2.2Z"
        />
      </svg>
      <p>{cautionText}</p>
    </aside>
  );
}
