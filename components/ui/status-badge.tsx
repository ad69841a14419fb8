import type { ReactNode } from "react";
import { cn } from "./cn";

/** Result statuses (against baseline and tolerance), schedule statuses, and alert states. */
export type Status =
  | "pass"
  | "warning"
  | "action"
  | "no-baseline"
  | "due"
  | "overdue"
  | "open"
  | "acknowledged"
  | "resolved";

/** Default visible text per status. */
export const STATUS_LABELS: Record<Status, string> = {
  pass: "Pass",
  warning: "Warning",
  action: "Action",
  "no-baseline": "No baseline",
  due: "Due",
  overdue: "Overdue",
  open: "Open",
  acknowledged: "Acknowledged",
  resolved: "Resolved",
};

const TONES = {
  pass: "border-pass-line bg-pass-soft text-pass",
  warn: "border-warn-line bg-warn-soft text-warn",
  act: "border-act-line bg-act-soft text-act",
  info: "border-info-line bg-info-soft text-info",
  neutral: "border-line-strong bg-surface-sunken text-ink-muted",
} as const;

const TONE_OF: Record<Status, keyof typeof TONES> = {
  pass: "pass",
  warning: "warn",
  action: "act",
  "no-baseline": "neutral",
  due: "info",
  overdue: "act",
  open: "warn",
  acknowledged: "info",
  resolved: "neutral",
};

const S = { fill: "none", stroke: "currentColor", strokeWidth: 1.6, strokeLinecap: "round", strokeLinejoin: "round" } as const;

/** One distinct shape per status, so the meaning never rests on colour (WCAG 1.4.1). */
const ICONS: Record<Status, ReactNode> = {
  // circle with a tick
  pass: (
    <>
      <circle cx="8" cy="8" r="6.2" {...S} />
      <path d="M5.3 8.2 7.2 10l3.5-3.9" {...S} />
    </>
  ),
  // diamond with an exclamation mark
  warning: (
    <>
      <path d="M8 1.6 14.4 8 8 14.4 1.6 8Z" {...S} />
      <path d="M8 5.2v3.3" {...S} />
      <circle cx="8" cy="10.9" r="0.9" fill="currentColor" />
    </>
  ),
  // solid octagon with a white bar: stop and act
  action: (
    <>
      <path d="M5.5 1.5h5l4 4v5l-4 4h-5l-4-4v-5Z" fill="currentColor" stroke="currentColor" strokeWidth={1} strokeLinejoin="round" />
      <path d="M4.8 8h6.4" stroke="#fff" strokeWidth={1.9} strokeLinecap="round" />
    </>
  ),
  // dashed circle with a dash: nothing to compare against
  "no-baseline": (
    <>
      <circle cx="8" cy="8" r="6.2" {...S} strokeDasharray="2.2 2" />
      <path d="M5.4 8h5.2" {...S} />
    </>
  ),
  // calendar page
  due: (
    <>
      <rect x="2.2" y="3.2" width="11.6" height="10.6" rx="1.6" {...S} />
      <path d="M2.2 6.6h11.6M5.4 1.8v2.6M10.6 1.8v2.6" {...S} />
    </>
  ),
  // clock whose time has run out, with a filled wedge
  overdue: (
    <>
      <circle cx="8" cy="8" r="6.2" {...S} />
      <path d="M8 8V1.8A6.2 6.2 0 0 1 14.2 8Z" fill="currentColor" opacity="0.35" />
      <path d="M8 4.6V8l2.4 1.6" {...S} />
    </>
  ),
  // ring with a solid centre: live
  open: (
    <>
      <circle cx="8" cy="8" r="6.2" {...S} />
      <circle cx="8" cy="8" r="2.8" fill="currentColor" />
    </>
  ),
  // eye: seen, not yet closed
  acknowledged: (
    <>
      <path d="M1.6 8S4 3.8 8 3.8 14.4 8 14.4 8 12 12.2 8 12.2 1.6 8 1.6 8Z" {...S} />
      <circle cx="8" cy="8" r="1.9" {...S} />
    </>
  ),
  // square with a tick: closed
  resolved: (
    <>
      <rect x="2.2" y="2.2" width="11.6" height="11.6" rx="2" {...S} />
      <path d="M5.2 8.2 7.2 10.1l3.6-4" {...S} />
    </>
  ),
};

/** The status glyph alone (decorative), e.g. for a legend or a chart marker. */
export function StatusIcon({ status, className }: { status: Status; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className={cn("size-3.5 shrink-0", className)}>
      {ICONS[status]}
    </svg>
  );
}

export interface StatusBadgeProps {
  status: Status;
  /** Visible text; default from STATUS_LABELS (e.g. "No baseline"). */
  label?: ReactNode;
  /**
   * Screen-reader-only words before the label, e.g. "Result:" or "Alert state:", where no
   * column header or heading gives the context.
   */
  srPrefix?: string;
  /** Tooltip with details, e.g. "MTF50 8 % below baseline (tolerance 10 %)". */
  title?: string;
  size?: "sm" | "md";
  className?: string;
}

/**
 * A status chip: tone colour + a distinct shape + words. Its accessible name is its visible text
 * (the icon is hidden), so it reads correctly inside table cells. Server-compatible.
 */
export function StatusBadge({ status, label, srPrefix, title, size = "md", className }: StatusBadgeProps) {
  return (
    <span
      title={title}
      data-status={status}
      className={cn(
        "inline-flex max-w-full items-center gap-1 rounded-chip border font-medium whitespace-nowrap",
        size === "sm" ? "h-5 px-1.5 text-caption" : "h-6 px-2 text-caption",
        TONES[TONE_OF[status]],
        className,
      )}
    >
      <StatusIcon status={status} className={size === "sm" ? "size-3" : "size-3.5"} />
      {srPrefix ? <span className="sr-only">{srPrefix} </span> : null}
      <span className="truncate">{label ?? STATUS_LABELS[status]}</span>
    </span>
  );
}
