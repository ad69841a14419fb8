import type { ComponentPropsWithRef, ReactNode } from "react";
import { cn } from "./cn";

export type ControlSize = "sm" | "md";

/**
 * Shared look of text-like form controls (Input, Textarea, Select): 3:1 border, inset shade,
 * red border plus inner ring when `aria-invalid="true"`, muted when disabled or read-only.
 */
export function controlClasses({ controlSize = "md", className }: { controlSize?: ControlSize; className?: string } = {}) {
  return cn(
    "block w-full min-w-0 rounded-control border border-line-control bg-surface text-ink shadow-inset",
    "placeholder:text-ink-subtle",
    "transition-[border-color] duration-150 hover:border-ink-subtle",
    "disabled:cursor-not-allowed disabled:border-line-strong disabled:bg-surface-sunken disabled:text-ink-subtle",
    "[&[readonly]]:bg-surface-canvas",
    "aria-invalid:border-act aria-invalid:ring-1 aria-invalid:ring-inset aria-invalid:ring-act",
    controlSize === "sm" ? "h-8 px-2.5 text-body" : "h-9 px-3 text-body",
    className,
  );
}

export interface InputProps extends ComponentPropsWithRef<"input"> {
  /** Marks the control invalid (sets `aria-invalid`); Field does this for you when it has an error. */
  invalid?: boolean;
  controlSize?: ControlSize;
  /** Short unit or hint shown inside the right edge, e.g. "mm" or "lp/cm". Not read twice: keep the unit in the label too. */
  suffix?: ReactNode;
}

/**
 * A text-like `<input>`. Forwards `ref` (works with react-hook-form's `register`). Server-compatible.
 * With `suffix`, the border moves to a wrapper so the unit sits inside the field.
 */
export function Input({ invalid, controlSize = "md", suffix, className, type = "text", ...rest }: InputProps) {
  // Tabular figures only for numeric entry: Inter's tnum also widens hyphens and colons in text.
  const numeric = type === "number" || rest.inputMode === "decimal" || rest.inputMode === "numeric";
  const ariaInvalid = invalid || rest["aria-invalid"] === true || rest["aria-invalid"] === "true" || undefined;
  if (suffix === undefined || suffix === null) {
    return <input type={type} {...rest} aria-invalid={ariaInvalid} className={controlClasses({ controlSize, className: cn(numeric && "tnum", className) })} />;
  }
  return (
    <span
      className={cn(
        controlClasses({ controlSize, className }),
        "flex items-center gap-2 has-[:disabled]:cursor-not-allowed has-[:disabled]:bg-surface-sunken",
        "has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-1 has-[:focus-visible]:outline-accent",
        ariaInvalid && "border-act ring-1 ring-inset ring-act",
      )}
    >
      <input
        type={type}
        {...rest}
        aria-invalid={ariaInvalid}
        className={cn(
          "h-full min-w-0 flex-1 bg-transparent text-inherit outline-none placeholder:text-ink-subtle focus-visible:outline-none disabled:cursor-not-allowed",
          numeric && "tnum",
        )}
      />
      <span aria-hidden="true" className="shrink-0 text-caption text-ink-subtle">
        {suffix}
      </span>
    </span>
  );
}
