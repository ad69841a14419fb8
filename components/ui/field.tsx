import { cloneElement, isValidElement, useId, type ReactElement, type ReactNode } from "react";
import { cn } from "./cn";

/** Props Field hands to its control. Spread them on an Input, Textarea, Select or native element. */
export interface FieldControlProps {
  id: string;
  "aria-describedby"?: string;
  "aria-invalid"?: true;
  "aria-required"?: true;
}

export interface FieldProps {
  /** Visible label text (required: every control needs a name). */
  label: ReactNode;
  /** Help text shown under the label, linked with `aria-describedby`. */
  hint?: ReactNode;
  /** Error message; when set, the control gets `aria-invalid` and the message is linked. Pass e.g. `errors.serial?.message`. */
  error?: ReactNode;
  /** Shows "required" beside the label and sets `aria-required` on the control. Validation stays with the form schema. */
  required?: boolean;
  /** Id for the control. Default: the child's own `id`, else a generated one. */
  id?: string;
  className?: string;
  /**
   * The control. Either one element — Field clones it and adds `id`, `aria-describedby`,
   * `aria-invalid` (its own ref, e.g. from `register`, is kept) — or a render function receiving
   * those props: `{(p) => <Input {...p} {...register("serial")} />}`.
   */
  children: ReactElement<Record<string, unknown>> | ((control: FieldControlProps) => ReactNode);
}

/**
 * Label + control + hint + error, wired for assistive technology. Server-compatible (no state);
 * works with react-hook-form: `<Field label="Serial number" error={errors.serial?.message}><Input {...register("serial")} /></Field>`.
 */
export function Field({ label, hint, error, required = false, id, className, children }: FieldProps) {
  const generated = useId();
  const childId =
    isValidElement(children) && typeof children.props.id === "string" ? (children.props.id as string) : undefined;
  const controlId = id ?? childId ?? `field${generated.replace(/[^a-zA-Z0-9_-]/g, "")}`;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const hasError = error !== undefined && error !== null && error !== false && error !== "";
  const errorId = hasError ? `${controlId}-error` : undefined;

  const ownDescribedBy =
    isValidElement(children) && typeof children.props["aria-describedby"] === "string"
      ? (children.props["aria-describedby"] as string)
      : undefined;
  const describedBy = [hintId, errorId, ownDescribedBy].filter(Boolean).join(" ") || undefined;

  const controlProps: FieldControlProps = {
    id: controlId,
    ...(describedBy ? { "aria-describedby": describedBy } : {}),
    ...(hasError ? { "aria-invalid": true as const } : {}),
    ...(required ? { "aria-required": true as const } : {}),
  };

  const control =
    typeof children === "function" ? children(controlProps) : isValidElement(children) ? cloneElement(children, { ...controlProps }) : children;

  return (
    <div className={cn("flex flex-col gap-1.5", className)}>
      <label htmlFor={controlId} className="flex items-baseline gap-2 text-body font-medium text-ink">
        {label}
        {required ? <span className="text-caption font-normal text-ink-subtle">required</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="-mt-1 text-caption text-ink-subtle">
          {hint}
        </p>
      ) : null}
      {control}
      {hasError ? (
        <p id={errorId} className="flex items-start gap-1.5 text-caption font-medium text-act">
          <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="mt-px size-3.5 shrink-0">
            <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
            <path d="M8 4.6v4.2" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
            <circle cx="8" cy="11.2" r="0.95" fill="currentColor" />
          </svg>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}
