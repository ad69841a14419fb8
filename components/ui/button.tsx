import type { ComponentPropsWithRef, ReactNode } from "react";
import { cn } from "./cn";
import { Spinner } from "./spinner";

const VARIANTS = {
  primary:
    "bg-accent text-ink-inverse shadow-card hover:bg-accent-strong active:bg-accent-strong border border-transparent",
  secondary:
    "bg-surface text-ink border border-line-control shadow-card hover:bg-surface-hover active:bg-surface-sunken",
  ghost: "bg-transparent text-accent border border-transparent hover:bg-accent-soft active:bg-accent-soft",
  danger: "bg-act text-ink-inverse border border-transparent shadow-card hover:bg-act-strong active:bg-act-strong",
} as const;

const SIZES = {
  sm: "h-8 gap-1.5 px-2.5 text-body",
  md: "h-9 gap-2 px-3.5 text-body",
  lg: "h-11 gap-2 px-5 text-lead",
  /** Square, for an icon-only button: give it `aria-label`. */
  icon: "size-8 text-body",
} as const;

export type ButtonVariant = keyof typeof VARIANTS;
export type ButtonSize = keyof typeof SIZES;

export interface ButtonProps extends ComponentPropsWithRef<"button"> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /**
   * Pending state: shows a spinner, sets `aria-busy` and `aria-disabled`, ignores clicks and
   * cannot submit — but keeps keyboard focus where it was (unlike `disabled`).
   */
  loading?: boolean;
  /** Label shown while loading, e.g. "Saving…". Default: the normal children. */
  loadingText?: ReactNode;
  /** Icon before the label (decorative; give it `aria-hidden`). */
  iconStart?: ReactNode;
  /** Icon after the label (decorative). */
  iconEnd?: ReactNode;
  fullWidth?: boolean;
}

/** Class list for link-styled-as-button (e.g. `<Link className={buttonClasses({variant:"secondary"})}>`). */
export function buttonClasses({
  variant = "primary",
  size = "md",
  fullWidth = false,
  className,
}: { variant?: ButtonVariant; size?: ButtonSize; fullWidth?: boolean; className?: string } = {}): string {
  return cn(
    "inline-flex shrink-0 select-none items-center justify-center whitespace-nowrap rounded-control font-medium",
    "transition-colors duration-150 no-underline",
    "disabled:cursor-not-allowed disabled:opacity-50 disabled:shadow-none",
    "aria-disabled:cursor-progress",
    VARIANTS[variant],
    SIZES[size],
    fullWidth && "w-full",
    className,
  );
}

/**
 * A button. Defaults to `type="button"`; pass `type="submit"` inside forms. Server-compatible
 * (no state); `ref` is forwarded to the `<button>` (React 19 ref-as-prop).
 */
export function Button({
  variant = "primary",
  size = "md",
  loading = false,
  loadingText,
  iconStart,
  iconEnd,
  fullWidth = false,
  type = "button",
  className,
  children,
  onClick,
  ...rest
}: ButtonProps) {
  return (
    <button
      {...rest}
      // While pending, a plain button that ignores clicks: no second submit, focus stays put.
      type={loading ? "button" : type}
      onClick={loading ? undefined : onClick}
      aria-busy={loading || undefined}
      aria-disabled={loading || rest["aria-disabled"] || undefined}
      className={buttonClasses({ variant, size, fullWidth, className })}
    >
      {loading ? <Spinner size={size === "lg" ? "md" : "sm"} decorative /> : iconStart}
      {loading && loadingText !== undefined ? loadingText : children}
      {loading ? null : iconEnd}
    </button>
  );
}
