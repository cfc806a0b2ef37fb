import { Link, type LinkProps } from "react-router-dom";

import { cn } from "@/lib/cn";

/** Inline link looks: underlined so it reads as a link without relying on colour alone. */
export const linkStyles =
  "font-semibold text-brand-700 underline decoration-brand-300 decoration-2 underline-offset-4 hover:text-brand-900 hover:decoration-brand-700";

export function TextLink({ className, ...props }: LinkProps) {
  return <Link className={cn(linkStyles, className)} {...props} />;
}
