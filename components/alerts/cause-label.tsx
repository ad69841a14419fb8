import { StatusIcon, cn } from "@/components/ui";
import type { AlertCauseName } from "./alert-types";

/** Words for each alert cause, and one sentence on what opened it. */
export const CAUSE_META: Record<AlertCauseName, { label: string; description: string }> = {
  action: { label: "Action level", description: "A result reached the action level: act, and consider taking the scanner out of clinical use." },
  warning: { label: "Warning level", description: "A result reached the warning level (the scanner alerts on warnings): investigate." },
  overdue: { label: "Overdue test", description: "A routine test is past its due date." },
  drift: { label: "Drift (advisory)", description: "Results drift towards a limit on the control chart, before any tolerance is reached." },
};

export const CAUSE_OPTIONS = (Object.keys(CAUSE_META) as AlertCauseName[]).map((value) => ({ value, label: CAUSE_META[value].label }));

/** Rising trend line with an arrow head: drift seen on the control chart. */
function DriftIcon({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className={cn("size-3.5 shrink-0", className)}>
      <path d="M1.8 12.6 6 8.4l2.6 2.4 5-5.4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
      <path d="M10.4 5.2h3.4v3.4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

const TONE: Record<AlertCauseName, string> = { action: "text-act", warning: "text-warn", overdue: "text-act", drift: "text-info" };

/** The cause of an alert as icon + words (the icon never carries the meaning alone). Server-compatible. */
export function CauseLabel({ cause, className }: { cause: AlertCauseName; className?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-1.5 whitespace-nowrap", className)} title={CAUSE_META[cause].description}>
      <span className={TONE[cause]}>{cause === "drift" ? <DriftIcon /> : <StatusIcon status={cause} />}</span>
      <span>{CAUSE_META[cause].label}</span>
    </span>
  );
}

/** Words for a proposed resolution: a passing re-test for action/warning alerts, the test done for an overdue one. */
export function proposalText(cause: AlertCauseName): { marker: string; event: string; link: string } {
  return cause === "overdue"
    ? { marker: "Test done — ready to resolve", event: "Test done — resolution proposed", link: "Open the result" }
    : { marker: "Re-test passed — ready to resolve", event: "Re-test passed — resolution proposed", link: "Open the re-test result" };
}
