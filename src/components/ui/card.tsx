import type { ComponentProps } from "react";

import { cn } from "@/lib/cn";

export type CardProps = ComponentProps<"div">;

export function Card({ className, ...props }: CardProps) {
  return (
    <div
      className={cn(
        "rounded-card border border-surface-line bg-surface p-4 shadow-sm md:p-5",
        className,
      )}
      {...props}
    />
  );
}
