import type { ReactNode } from "react";
import { cn } from "./cn";

/**
 * Formats a measurement with a fixed number of decimals and a true minus sign (U+2212).
 * `null`, `undefined`, NaN and ±Infinity give "—". Locale-free on purpose, so server and
 * client render the same text (no hydration mismatch) and decimals never turn into commas.
 */
export function formatMetric(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  const text = value.toFixed(digits);
  // -0.00 reads as a loss that is not there.
  if (/^-0\.?0*$/.test(text)) return text.slice(1);
  return text.startsWith("-") ? `\u2212${text.slice(1)}` : text;
}

const SIZES = {
  sm: { value: "text-lead font-semibold", unit: "text-caption" },
  md: { value: "text-title font-semibold", unit: "text-body" },
  lg: { value: "text-display font-semibold", unit: "text-lead" },
} as const;

export interface MetricProps {
  /** Name of the quantity, e.g. "FWHM" or "MTF50". */
  label: ReactNode;
  value: number | null | undefined;
  /** Unit after the number, e.g. "mm", "lp/cm", "mm⁻¹", "%". */
  unit?: string;
  /** Decimals shown. Default 2. */
  digits?: number;
  /** Small line under the value, e.g. "baseline 1.21 mm" or a StatusBadge. */
  hint?: ReactNode;
  size?: keyof typeof SIZES;
  /** Text read instead of "—" when there is no value. Default "not available". */
  missingLabel?: string;
  className?: string;
}

/**
 * A labelled measurement: `<Metric label="FWHM" value={1.234} unit="mm" digits={2} />` → "1.23 mm".
 * Tabular figures; "—" (read as "not available") for null. Rendered as a one-term `<dl>`. Server-compatible.
 */
export function Metric({ label, value, unit, digits = 2, hint, size = "md", missingLabel = "not available", className }: MetricProps) {
  const text = formatMetric(value, digits);
  const missing = text === "—";
  return (
    <dl className={cn("flex min-w-0 flex-col gap-0.5", className)}>
      <dt className="text-caption font-medium text-ink-muted">{label}</dt>
      <dd className="flex items-baseline gap-1 tnum text-ink">
        {missing ? (
          <>
            <span aria-hidden="true" className={cn(SIZES[size].value, "text-ink-subtle")}>
              —
            </span>
            <span className="sr-only">{missingLabel}</span>
          </>
        ) : (
          <>
            <span className={SIZES[size].value}>{text}</span>
            {unit ? <span className={cn(SIZES[size].unit, "text-ink-muted")}>{unit}</span> : null}
          </>
        )}
      </dd>
      {hint ? <dd className="text-caption text-ink-subtle">{hint}</dd> : null}
    </dl>
  );
}
