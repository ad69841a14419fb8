import type { ComponentPropsWithRef } from "react";
import { cn } from "./cn";
import { controlClasses } from "./input";

export interface TextareaProps extends ComponentPropsWithRef<"textarea"> {
  /** Marks the control invalid (sets `aria-invalid`); Field does this for you when it has an error. */
  invalid?: boolean;
}

/** A multi-line text control, vertically resizable. Forwards `ref`. Server-compatible. */
export function Textarea({ invalid, className, rows = 4, ...rest }: TextareaProps) {
  return (
    <textarea
      rows={rows}
      {...rest}
      aria-invalid={invalid || rest["aria-invalid"] === true || rest["aria-invalid"] === "true" || undefined}
      className={cn(controlClasses(), "h-auto min-h-20 resize-y px-3 py-2 leading-[1.375rem]", className)}
    />
  );
}
