import { type ReactNode, useState } from "react";

import { Button } from "./button";

export interface CopyValueProps {
  /** The text to copy, shown whole and selectable. */
  value: string;
  /** What the button says, e.g. "Copy token". */
  copyLabel: ReactNode;
  /** What the value is, for the fallback: "select the token and copy it". */
  noun: string;
  /** More buttons beside the copy button (e.g. Done). */
  children?: ReactNode;
}

/**
 * A value to copy (a secret shown once, an address to register elsewhere): the value itself,
 * selectable, a copy button, and a status line saying whether copying worked.
 */
export function CopyValue({ value, copyLabel, noun, children }: CopyValueProps) {
  const [copied, setCopied] = useState<"yes" | "no" | null>(null);
  const copy = () => {
    const clipboard = typeof navigator === "undefined" ? undefined : navigator.clipboard;
    if (!clipboard) {
      setCopied("no");
      return;
    }
    clipboard.writeText(value).then(
      () => setCopied("yes"),
      () => setCopied("no"),
    );
  };
  return (
    <div className="flex flex-col gap-3">
      <p className="rounded-lg border border-surface-line bg-surface-sunken px-3 py-2 font-mono text-sm break-all select-all">
        {value}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" onClick={copy}>
          {copyLabel}
        </Button>
        {children}
        <span role="status" className="text-sm text-ink-muted">
          {copied === "yes"
            ? "Copied."
            : copied === "no"
              ? `This browser did not allow copying: select the ${noun} and copy it.`
              : null}
        </span>
      </div>
    </div>
  );
}
