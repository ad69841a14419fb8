import type { ReactNode } from "react";
import { cn } from "./cn";

export type CalloutTone = "info" | "caution" | "error" | "success";

const TONES: Record<CalloutTone, { box: string; icon: ReactNode }> = {
  info: {
    box: "border-info-line bg-info-soft text-info",
    icon: (
      <>
        <circle cx="10" cy="10" r="7.6" fill="none" stroke="currentColor" strokeWidth="1.6" />
        <path d="M10 9v4.6" stroke="currentColor" strokeWidth="1.7" strokeLinecap="round" />
        <circle cx="10" cy="6.3" r="1" fill="currentColor" />
      </>
    ),
  },
  caution: {
    box: "border-warn-line bg-warn-soft text-warn",
    icon: (
      <>
        <path d="M10 2.2 17.8 10 10 17.8 2.2 10Z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
        <path d="M10 6.4v4.2" stroke="currentColor" strokeWidth="1.7" strokeLinecap="round" />
        <circle cx="10" cy="13.3" r="1" fill="currentColor" />
      </>
    ),
  },
  error: {
    box: "border-act-line bg-act-soft text-act",
    icon: (
      <>
        <path d="M7 2.2h6l4.8 4.8v6L13 17.8H7L2.2 13V7Z" fill="currentColor" />
        <path d="M6.6 10h6.8" stroke="#fff" strokeWidth="2" strokeLinecap="round" />
      </>
    ),
  },
  success: {
    box: "border-pass-line bg-pass-soft text-pass",
    icon: (
      <>
        <circle cx="10" cy="10" r="7.6" fill="none" stroke="currentColor" strokeWidth="1.6" />
        <path d="M6.6 10.2 8.9 12.4 13.4 7.6" fill="none" stroke="currentColor" strokeWidth="1.7" strokeLinecap="round" strokeLinejoin="round" />
      </>
    ),
  },
};

export interface CalloutProps {
  tone?: CalloutTone;
  /** Bold first line. */
  title?: ReactNode;
  children?: ReactNode;
  /**
   * ARIA role. Default: `alert` for `error` (announced at once — use it for messages that appear
   * after an action), `note` otherwise (static guidance). Pass `status` for polite live updates.
   */
  role?: "note" | "alert" | "status";
  /** Action(s) under the text, e.g. a ghost Button. */
  actions?: ReactNode;
  className?: string;
}

/** Framed notice with a tone icon and a role. Text, not colour, carries the message. Server-compatible. */
export function Callout({ tone = "info", title, children, role, actions, className }: CalloutProps) {
  const t = TONES[tone];
  return (
    <div role={role ?? (tone === "error" ? "alert" : "note")} className={cn("flex gap-3 rounded-control border px-4 py-3", t.box, className)}>
      <svg viewBox="0 0 20 20" aria-hidden="true" focusable="false" className="mt-0.5 size-4.5 shrink-0">
        {t.icon}
      </svg>
      <div className="flex min-w-0 flex-col gap-1 text-body text-ink">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className="text-ink-muted [&_a]:font-medium [&_a]:text-accent [&_a]:underline">{children}</div> : null}
        {actions ? <div className="mt-1.5 flex flex-wrap gap-2">{actions}</div> : null}
      </div>
    </div>
  );
}

/** Standard wording of the clinical caution shown beside results. */
export const CLINICAL_CAUTION_TEXT =
  "Results support, and never replace, the judgement of the qualified medical physicist. Tolerances must follow local regulations, the manufacturer's specifications and your department's QA programme; standard values hold only for the stated acquisition and reconstruction settings.";

/** The clinical caution as a ready-made caution Callout. */
export function ClinicalCaution({ className, children }: { className?: string; children?: ReactNode }) {
  return (
    <Callout tone="caution" title="For decision support only" className={className}>
      {children ?? CLINICAL_CAUTION_TEXT}
    </Callout>
  );
}
