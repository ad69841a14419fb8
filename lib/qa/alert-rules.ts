/**
 * What a new result, or a scheduled due-date check, does to a scanner's alerts. Pure: the caller loads the open
 * alerts, calls planAlertChanges and applies the plan in one transaction.
 *
 * Rules (ALERT_RULES, in this order):
 * 1. A result at action level opens an alert with cause "action".
 * 2. A result at warning level opens one with cause "warning" only if the scanner's alertOnWarning is true.
 * 3. An overdue test opens an "overdue" alert.
 * 4. A control-limit drift flag on the bad side opens an advisory with cause "drift" — unless the same result
 *    raises an action or warning alert: the advisory warns of drift *before* failure, and one e-mail per result is
 *    enough.
 * 5. One open alert per scanner × test × cause: when one is already open, the repeat updates it (the caller bumps
 *    its count and latest value) instead of opening another.
 * 6. A passing re-test proposes resolution of the open "action" and "warning" alerts of that scanner × test;
 *    any new result proposes resolution of its open "overdue" alert (the test has been done).
 * Resolution is only proposed: a person confirms it (domain notes §8: results support, not replace, the physicist).
 */
import type { DriftFlag } from "./control-limits";
import type { DueStateName } from "./schedule";
import type { Status } from "./tolerance";

export type AlertCause = "action" | "warning" | "overdue" | "drift";
export type AlertSeverity = "action" | "warning" | "advisory";
/** Alert life cycle; "open" and "acknowledged" alerts count as open for dedupe and resolution. */
export type AlertState = "open" | "acknowledged" | "resolved";
export const ACTIVE_ALERT_STATES: readonly AlertState[] = ["open", "acknowledged"];

export const ALERT_RULES: readonly string[] = [
  "a result at action level opens an alert (cause 'action')",
  "a result at warning level opens an alert (cause 'warning') only if the scanner's alertOnWarning is true",
  "an overdue test opens an alert (cause 'overdue')",
  "a control-limit drift flag on the bad side opens an advisory (cause 'drift') unless the same result raises an action or warning alert",
  "one open alert per scanner × test × cause: a repeat updates it rather than opening another",
  "a passing re-test proposes resolution of open 'action'/'warning' alerts of that scanner × test; any new result proposes resolution of its 'overdue' alert",
];

export const ALERT_SEVERITY: Readonly<Record<AlertCause, AlertSeverity>> = {
  action: "action",
  warning: "warning",
  overdue: "warning",
  drift: "advisory",
};

type Id = string | number;

export interface OpenAlertRef {
  id: Id;
  cause: AlertCause;
  testId: Id;
  state: AlertState;
}

export interface AlertPlanInput {
  scannerId: Id;
  testId: Id;
  /** The new result; null for a scheduled due-date check without a result. */
  resultId: Id | null;
  /** Worst status of the new result (worstStatus); null without a result. */
  status: Status | null;
  /** Drift flags that involve the new result (see alertingFlags); only isBadSide flags count. */
  driftFlags: readonly DriftFlag[];
  alertOnWarning: boolean;
  /** Due state of a scheduled check; "overdue" opens or updates an overdue alert. Ignored with a result (it ends the overdue state). */
  dueState?: DueStateName | null;
  /** Text for summaries, e.g. "MTF50 0.41 cycles/mm, 18.0 % below baseline". */
  detail?: string;
  /** Alerts of this scanner (any test); others are ignored. */
  openAlerts: readonly OpenAlertRef[];
}

export interface AlertPlan {
  open: { cause: AlertCause; severity: AlertSeverity; summary: string; key: string }[];
  update: { alertId: Id; cause: AlertCause; summary: string }[];
  proposeResolution: { alertId: Id; cause: AlertCause; reason: string }[];
}

/** Dedupe key of an alert: one open alert per scanner × test × cause. Parts are URI-encoded so ":" stays a separator. */
export function alertKey(scannerId: Id, testId: Id, cause: AlertCause): string {
  return [scannerId, testId, cause].map((p) => encodeURIComponent(String(p))).join(":");
}

function causeText(cause: AlertCause, input: AlertPlanInput, badFlags: readonly DriftFlag[]): string {
  const detail = input.detail ? `: ${input.detail}` : "";
  switch (cause) {
    case "action":
      return `Action level reached${detail}`;
    case "warning":
      return `Warning level reached${detail}`;
    case "overdue":
      return "Test overdue";
    case "drift":
      return `Drift before failure: ${[...new Set(badFlags.map((f) => f.description))].join("; ")}${detail}`;
  }
}

/**
 * Plans alert changes for one scanner × test (rules in the module comment). Never opens two alerts with the same
 * alertKey: when several open alerts already share a key (legacy data), the first one in `openAlerts` is updated.
 */
export function planAlertChanges(input: AlertPlanInput): AlertPlan {
  const plan: AlertPlan = { open: [], update: [], proposeResolution: [] };
  const active = input.openAlerts.filter((a) => String(a.testId) === String(input.testId) && ACTIVE_ALERT_STATES.includes(a.state));
  const findOpen = (cause: AlertCause): OpenAlertRef | undefined => active.find((a) => a.cause === cause);
  const badFlags = input.driftFlags.filter((f) => f.isBadSide);

  const raise = (cause: AlertCause): void => {
    const summary = causeText(cause, input, badFlags);
    const existing = findOpen(cause);
    if (existing) plan.update.push({ alertId: existing.id, cause, summary });
    else plan.open.push({ cause, severity: ALERT_SEVERITY[cause], summary, key: alertKey(input.scannerId, input.testId, cause) });
  };

  if (input.status === "action") raise("action");
  if (input.status === "warning" && input.alertOnWarning) raise("warning");
  if (input.dueState === "overdue" && input.resultId === null) raise("overdue");
  const failureRaised = input.status === "action" || (input.status === "warning" && input.alertOnWarning);
  if (badFlags.length > 0 && !failureRaised) raise("drift");

  if (input.status === "pass") {
    for (const a of active) {
      if (a.cause === "action" || a.cause === "warning") {
        plan.proposeResolution.push({ alertId: a.id, cause: a.cause, reason: "a later result of this test passed" });
      }
    }
  }
  if (input.resultId !== null) {
    for (const a of active) {
      if (a.cause === "overdue") plan.proposeResolution.push({ alertId: a.id, cause: a.cause, reason: "the test has been done" });
    }
  }
  return plan;
}
