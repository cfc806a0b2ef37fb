import { Fragment, type ReactNode } from "react";

import { linkStyles } from "@/components/ui/text-link";
import { cn } from "@/lib/cn";

const urlPattern = /https?:\/\/[^\s<>"']+/g;
// Punctuation that ends a sentence rather than the address it follows.
const trailingPunctuation = /[.,;:!?)\]]+$/;

/** Plain text with every web address turned into a link; nothing else is interpreted. */
export function LinkedText({ text }: { text: string }) {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(urlPattern)) {
    const start = match.index;
    const url = match[0].replace(trailingPunctuation, "");
    parts.push(<Fragment key={`t${start}`}>{text.slice(last, start)}</Fragment>);
    parts.push(
      <a key={`a${start}`} href={url} className={cn(linkStyles, "break-all")}>
        {url}
      </a>,
    );
    last = start + url.length;
  }
  parts.push(<Fragment key="end">{text.slice(last)}</Fragment>);
  return <>{parts}</>;
}
