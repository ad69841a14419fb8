import type { ComponentPropsWithRef } from "react";
import { cn } from "./cn";
import { controlClasses, type ControlSize } from "./input";

export interface SelectProps extends ComponentPropsWithRef<"select"> {
  /** Marks the control invalid (sets `aria-invalid`); Field does this for you when it has an error. */
  invalid?: boolean;
  controlSize?: ControlSize;
  /** Adds a first, empty option such as "Choose a scanner…" (value ""). */
  placeholder?: string;
}

/**
 * A native `<select>` with Halfmax styling and its own chevron; keyboard and screen-reader
 * behaviour stay the browser's. Forwards `ref` to the `<select>`. Server-compatible.
 * `className` applies to the outer wrapper (for width).
 */
export function Select({ invalid, controlSize = "md", placeholder, className, children, multiple, ...rest }: SelectProps) {
  return (
    <span className={cn("relative block", className)}>
      <select
        {...rest}
        multiple={multiple}
        aria-invalid={invalid || rest["aria-invalid"] === true || rest["aria-invalid"] === "true" || undefined}
        className={cn(
          controlClasses({ controlSize }),
          "appearance-none",
          multiple ? "h-auto py-1.5" : "pr-9",
          "cursor-pointer disabled:cursor-not-allowed",
        )}
      >
        {placeholder !== undefined && !multiple ? (
          <option value="" disabled={rest.required}>
            {placeholder}
          </option>
        ) : null}
        {children}
      </select>
      {multiple ? null : (
        <svg
          viewBox="0 0 16 16"
          aria-hidden="true"
          focusable="false"
          className="pointer-events-none absolute top-1/2 right-3 size-3.5 -translate-y-1/2 text-ink-muted"
        >
          <path d="M4 6.5 8 10.5 12 6.5" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      )}
    </span>
  );
}
