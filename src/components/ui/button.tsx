import type { ComponentProps } from "react";

import { cn } from "@/lib/cn";

export type ButtonVariant = "primary" | "secondary" | "quiet" | "danger";
export type ButtonSize = "md" | "lg";

const base =
  "inline-flex min-h-tap items-center justify-center gap-2 rounded-lg font-semibold transition-colors " +
  "disabled:cursor-not-allowed disabled:opacity-60";

const variants: Record<ButtonVariant, string> = {
  primary: "bg-brand-700 text-white hover:bg-brand-800 active:bg-brand-900",
  secondary:
    "border border-surface-line bg-surface text-brand-800 hover:bg-brand-50 active:bg-brand-100",
  quiet: "text-brand-700 hover:bg-brand-50 active:bg-brand-100",
  danger: "bg-verdict-not-ready text-white hover:brightness-90",
};

const sizes: Record<ButtonSize, string> = {
  md: "px-4 py-2 text-base",
  lg: "px-5 py-3 text-lg",
};

/** Button looks, also for links that act as buttons. */
export function buttonStyles({
  variant = "primary",
  size = "md",
  className,
}: { variant?: ButtonVariant; size?: ButtonSize; className?: string } = {}): string {
  return cn(base, variants[variant], sizes[size], className);
}

export interface ButtonProps extends ComponentProps<"button"> {
  variant?: ButtonVariant;
  size?: ButtonSize;
}

export function Button({ variant, size, className, type = "button", ...props }: ButtonProps) {
  return <button type={type} className={buttonStyles({ variant, size, className })} {...props} />;
}
