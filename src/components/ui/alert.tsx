import type { ComponentProps, ReactNode } from "react";

import { cn } from "@/lib/cn";

export type AlertTone = "error" | "warning" | "info" | "success";

const tones: Record<AlertTone, string> = {
  error: "border-verdict-not-ready bg-verdict-not-ready/10 text-verdict-not-ready",
  warning: "border-verdict-conditions bg-verdict-conditions/10 text-verdict-conditions",
  info: "border-brand-600 bg-brand-50 text-brand-800",
  success: "border-verdict-ready bg-verdict-ready/10 text-verdict-ready",
};

export interface AlertProps extends Omit<ComponentProps<"div">, "title"> {
  tone?: AlertTone;
  title?: ReactNode;
}

/**
 * A boxed message. Pass `role="alert"` when it appears in answer to something the person did, so
 * screen readers announce it at once.
 */
export function Alert({ tone = "info", title, className, children, ...props }: AlertProps) {
  return (
    <div
      className={cn(
        "rounded-lg border-l-4 px-4 py-3 text-sm leading-relaxed",
        tones[tone],
        className,
      )}
      {...props}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={cn(title && "mt-1", "text-ink")}>{children}</div> : null}
    </div>
  );
}
