import { describe, expect, it } from "vitest";
import { alertKey, planAlertChanges, type AlertPlanInput, type OpenAlertRef } from "@/lib/qa/alert-rules";
import type { DriftFlag } from "@/lib/qa/control-limits";

// Reference: the alerting policy stated in the brief and in alert-rules.ts (common practice for QA programmes with
// two tiers and one open alert per problem; no external source).

const input = (over: Partial<AlertPlanInput>): AlertPlanInput => ({
  scannerId: 7,
  testId: 3,
  resultId: 101,
  status: "pass",
  driftFlags: [],
  alertOnWarning: false,
  openAlerts: [],
  ...over,
});
const alert = (id: number, cause: OpenAlertRef["cause"], testId = 3, state: OpenAlertRef["state"] = "open"): OpenAlertRef => ({
  id,
  cause,
  testId,
  state,
});
const flag = (isBadSide: boolean): DriftFlag => ({
  rule: "2-of-3-beyond-2-sigma",
  description: "2 of 3 consecutive points beyond 2σ on the same side",
  pointIndices: [4, 6],
  side: isBadSide ? "low" : "high",
  isBadSide,
});

describe("planAlertChanges", () => {
  it("planAlertChanges(action result) opens one 'action' alert keyed by scanner × test × cause", () => {
    const plan = planAlertChanges(input({ status: "action", detail: "MTF50 0.33 cycles/mm, 17.5 % below baseline" }));
    expect(plan.open).toEqual([
      { cause: "action", severity: "action", key: alertKey(7, 3, "action"), summary: "Action level reached: MTF50 0.33 cycles/mm, 17.5 % below baseline" },
    ]);
    expect(plan.update).toEqual([]);
    expect(plan.proposeResolution).toEqual([]);
  });

  it("planAlertChanges(repeat action) updates the open alert instead of opening a second one", () => {
    const plan = planAlertChanges(input({ status: "action", openAlerts: [alert(55, "action"), alert(56, "action", 4)] }));
    expect(plan.open).toEqual([]);
    expect(plan.update).toEqual([expect.objectContaining({ alertId: 55, cause: "action" })]);
  });

  it("planAlertChanges ignores resolved alerts and other tests' alerts when deduplicating", () => {
    const plan = planAlertChanges(input({ status: "action", openAlerts: [alert(55, "action", 3, "resolved"), alert(56, "action", 4)] }));
    expect(plan.open.map((o) => o.cause)).toEqual(["action"]);
    expect(plan.update).toEqual([]);
  });

  it("planAlertChanges counts acknowledged alerts as open", () => {
    const plan = planAlertChanges(input({ status: "action", openAlerts: [alert(60, "action", 3, "acknowledged")] }));
    expect(plan.update.map((u) => u.alertId)).toEqual([60]);
    expect(plan.open).toEqual([]);
  });

  it("planAlertChanges(warning) opens an alert only when the scanner's alertOnWarning is set", () => {
    expect(planAlertChanges(input({ status: "warning", alertOnWarning: false }))).toEqual({ open: [], update: [], proposeResolution: [] });
    const plan = planAlertChanges(input({ status: "warning", alertOnWarning: true }));
    expect(plan.open).toEqual([expect.objectContaining({ cause: "warning", severity: "warning" })]);
  });

  it("planAlertChanges(overdue check) opens an 'overdue' alert, then updates it on the next check", () => {
    const check = input({ resultId: null, status: null, dueState: "overdue" });
    expect(planAlertChanges(check).open).toEqual([expect.objectContaining({ cause: "overdue", summary: "Test overdue" })]);
    const again = planAlertChanges({ ...check, openAlerts: [alert(70, "overdue")] });
    expect(again.open).toEqual([]);
    expect(again.update).toEqual([expect.objectContaining({ alertId: 70, cause: "overdue" })]);
  });

  it("planAlertChanges(new result) proposes resolving the test's overdue alert", () => {
    const plan = planAlertChanges(input({ status: "warning", openAlerts: [alert(70, "overdue"), alert(71, "overdue", 9)] }));
    expect(plan.proposeResolution).toEqual([expect.objectContaining({ alertId: 70, cause: "overdue" })]);
  });

  it("planAlertChanges opens a drift advisory for bad-side flags only", () => {
    expect(planAlertChanges(input({ driftFlags: [flag(false)] })).open).toEqual([]);
    const plan = planAlertChanges(input({ driftFlags: [flag(true), flag(true)] }));
    expect(plan.open).toHaveLength(1);
    expect(plan.open[0]).toMatchObject({ cause: "drift", severity: "advisory" });
    expect(plan.open[0]!.summary).toContain("2 of 3 consecutive points beyond 2σ");
  });

  it("planAlertChanges(passing re-test) proposes resolution of open action and warning alerts of that test only", () => {
    const open = [alert(1, "action"), alert(2, "warning"), alert(3, "drift"), alert(4, "action", 8), alert(5, "warning", 3, "resolved")];
    const plan = planAlertChanges(input({ status: "pass", openAlerts: open }));
    expect(plan.proposeResolution.map((p) => p.alertId)).toEqual([1, 2]);
    expect(plan.open).toEqual([]);
    expect(plan.update).toEqual([]);
  });

  it("planAlertChanges(no-baseline or warning) does not propose resolution of action alerts", () => {
    for (const status of ["no-baseline", "warning"] as const) {
      const plan = planAlertChanges(input({ status, openAlerts: [alert(1, "action")] }));
      expect(plan.proposeResolution).toEqual([]);
      expect(plan.open).toEqual([]);
    }
  });

  it("planAlertChanges(action with a bad drift flag) raises only the action alert (drift is advisory before failure)", () => {
    const plan = planAlertChanges(input({ status: "action", driftFlags: [flag(true)], openAlerts: [alert(9, "drift")] }));
    expect(plan.open.map((o) => o.cause)).toEqual(["action"]);
    expect(plan.update).toEqual([]);
    const none = planAlertChanges(input({ status: "action", driftFlags: [flag(true)] }));
    expect(none.open.map((o) => o.cause)).toEqual(["action"]);
  });

  it("planAlertChanges(warning with a bad drift flag) opens the drift advisory when warnings do not alert", () => {
    expect(planAlertChanges(input({ status: "warning", alertOnWarning: false, driftFlags: [flag(true)] })).open.map((o) => o.cause)).toEqual(["drift"]);
    expect(planAlertChanges(input({ status: "warning", alertOnWarning: true, driftFlags: [flag(true)] })).open.map((o) => o.cause)).toEqual(["warning"]);
  });
});

describe("alertKey", () => {
  it("alertKey(scanner, test, cause) differs when any part differs and cannot collide through ':'", () => {
    expect(alertKey(1, 2, "action")).toBe(alertKey("1", "2", "action"));
    expect(alertKey(1, 2, "action")).not.toBe(alertKey(1, 2, "warning"));
    expect(alertKey(1, 2, "action")).not.toBe(alertKey(2, 1, "action"));
    expect(alertKey("a:b", "c", "drift")).not.toBe(alertKey("a", "b:c", "drift"));
  });
});
