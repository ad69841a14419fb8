import { mean as mjMean, std as mjStd } from "mathjs";
import { describe, expect, it } from "vitest";
import { alertingFlags, controlLimits, detectDrift, type ControlLimits, type DriftFlag } from "@/lib/qa/control-limits";
import { QaError } from "@/lib/qa/qa-error";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

// Constructed chart: mean 10, σ = 1, so the 1σ/2σ/3σ lines sit at 9/11, 8/12, 7/13.
const limits: ControlLimits = { mean: 10, sd: 1, n: 20, lower2: 8, upper2: 12, lower3: 7, upper3: 13 };
const daily = (values: number[]) => values.map((value, i) => ({ value, at: new Date(Date.UTC(2025, 0, 1 + i)) }));
const run = (values: number[], direction: "higher-is-worse" | "lower-is-worse" = "higher-is-worse") =>
  detectDrift(daily(values), limits, direction).flags;
const byRule = (flags: DriftFlag[], rule: string) => flags.filter((f) => f.rule === rule);
// Filler that alternates inside ±1σ: never on one side twice in a row, never monotonic, so it fires no rule.
const CALM = [10.5, 9.5, 10.5, 9.5, 10.5, 9.5];

describe("controlLimits", () => {
  it("controlLimits(values) is mean ± 2σ and ± 3σ with the n − 1 SD of mathjs", () => {
    const rng = createRandom(7);
    const values = Array.from({ length: 25 }, () => 0.5 + 0.01 * rng.normal());
    const l = controlLimits(values);
    const m = mjMean(values);
    const s = mjStd(values, "unbiased") as unknown as number; // independent reference: mathjs
    expectClose(l.mean, m, { rel: 1e-12 });
    expectClose(l.sd, s, { rel: 1e-10 });
    // Shewhart chart limits (Western Electric Statistical Quality Control Handbook, 1956).
    expectClose(l.upper2, m + 2 * s, { rel: 1e-12 });
    expectClose(l.lower2, m - 2 * s, { rel: 1e-12 });
    expectClose(l.upper3, m + 3 * s, { rel: 1e-12 });
    expectClose(l.lower3, m - 3 * s, { rel: 1e-12 });
    expect(l.n).toBe(25);
  });

  it("controlLimits refuses fewer than 2 values and values without spread", () => {
    expect(() => controlLimits([1])).toThrow(/at least 2 baseline values, got 1/);
    expect(() => controlLimits([2, 2, 2])).toThrow(QaError);
  });
});

describe("detectDrift run rules on constructed sequences", () => {
  it("detectDrift flags one point beyond 3σ, but not a point on the 3σ line (WE rule 1 / Nelson rule 1)", () => {
    // Western Electric (1956) rule 1 / Nelson (1984) rule 1 — rule text from memory.
    const flags = run([10.5, 9.5, 13.01, 9.5, 10.5]);
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ rule: "beyond-3-sigma", pointIndices: [2], side: "high", isBadSide: true });
    expect(run([10.5, 9.5, 13, 9.5, 10.5])).toEqual([]); // on the limit is not beyond it
    const low = run([10.5, 9.5, 6.5, 9.5]);
    expect(low[0]).toMatchObject({ rule: "beyond-3-sigma", side: "low", isBadSide: false });
  });

  it("detectDrift flags 2 of 3 beyond 2σ on one side, not 2 beyond 2σ three apart or on opposite sides (WE rule 2)", () => {
    // Western Electric rule 2 / Nelson rule 5 (from memory).
    const flags = run([10.5, 12.5, 9.5, 12.5, 9.5]);
    expect(byRule(flags, "2-of-3-beyond-2-sigma")).toEqual([
      expect.objectContaining({ pointIndices: [1, 3], side: "high" }),
    ]);
    expect(flags).toHaveLength(1);
    expect(run([10.5, 12.5, 9.5, 9.5, 12.5, 9.5])).toEqual([]); // the two points never share a window of 3
    expect(run([10.5, 12.5, 7.5, 10.5, 9.5])).toEqual([]); // one high, one low
    expect(run([10.5, 12.5, 9.5, 12, 9.5])).toEqual([]); // 12 is on the 2σ line, not beyond
  });

  it("detectDrift flags 4 of 5 beyond 1σ on one side, not 3 of 5 (WE rule 3)", () => {
    // Western Electric rule 3 / Nelson rule 6 (from memory).
    const flags = run([...CALM, 8.5, 8.5, 9.5, 8.5, 8.5, ...CALM]);
    expect(flags).toEqual([
      expect.objectContaining({ rule: "4-of-5-beyond-1-sigma", pointIndices: [6, 7, 9, 10], side: "low", isBadSide: false }),
    ]);
    expect(run([...CALM, 8.5, 8.5, 9.5, 8.5, 9, ...CALM])).toEqual([]); // 9 is on the 1σ line
  });

  it("detectDrift flags 8 in a row on one side of the mean, not 7 then a point on the mean (WE rule 4)", () => {
    // Western Electric rule 4: 8 in a row; Nelson rule 2 uses 9 (from memory).
    const eight = [10.2, 10.4, 10.1, 10.3, 10.2, 10.5, 10.1, 10.3];
    const flags = run([10.5, 9.5, ...eight, 9.5]);
    expect(flags).toEqual([
      expect.objectContaining({ rule: "8-on-one-side", pointIndices: [2, 3, 4, 5, 6, 7, 8, 9], side: "high" }),
    ]);
    expect(run([10.5, 9.5, ...eight.slice(0, 7), 10, 9.5])).toEqual([]);
  });

  it("detectDrift flags 6 steadily decreasing points, not 5 then a tie (Nelson rule 3)", () => {
    // Nelson (1984) rule 3: six points in a row steadily increasing or decreasing (from memory).
    const falling = [10.5, 10.3, 10.1, 9.9, 9.7, 9.5];
    const flags = run([9.5, 10.5, 9.6, ...falling, 10.5], "lower-is-worse");
    expect(flags).toEqual([
      expect.objectContaining({ rule: "6-trending", pointIndices: [3, 4, 5, 6, 7, 8], side: "low", isBadSide: true }),
    ]);
    expect(run([9.5, 10.5, 9.6, 10.5, 10.3, 10.1, 9.9, 9.7, 9.7, 10.5])).toEqual([]);
  });

  it("detectDrift merges overlapping windows of one rule into one flag (10 in a row → one 8-on-one-side flag)", () => {
    const ten = [10.2, 10.4, 10.1, 10.3, 10.2, 10.5, 10.1, 10.3, 10.2, 10.4];
    const flags = byRule(run(ten), "8-on-one-side");
    expect(flags).toHaveLength(1);
    expect(flags[0]!.pointIndices).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("detectDrift marks the bad side from the direction: high for widths, low for MTF", () => {
    const high = run([10.5, 9.5, 13.5], "higher-is-worse");
    const sameForMtf = run([10.5, 9.5, 13.5], "lower-is-worse");
    expect(high[0]!.isBadSide).toBe(true);
    expect(sameForMtf[0]!.isBadSide).toBe(false);
  });

  it("detectDrift orders points by time and reports indices of the given array", () => {
    // Same sequence as the 2-of-3 case, given in reverse order with its dates.
    const points = daily([10.5, 12.5, 9.5, 12.5, 9.5]).reverse();
    const flags = detectDrift(points, limits, "higher-is-worse").flags;
    expect(flags).toEqual([expect.objectContaining({ rule: "2-of-3-beyond-2-sigma", pointIndices: [3, 1] })]);
  });

  it("alertingFlags(drift, latest) keeps bad-side flags that involve the latest point", () => {
    const drift = detectDrift(daily([10.5, 9.5, 13.5, 9.5, 6.5]), limits, "higher-is-worse");
    expect(alertingFlags(drift, 4)).toEqual([]); // the low 3σ point is on the good side for a width
    expect(alertingFlags(drift, 2).map((f) => f.rule)).toEqual(["beyond-3-sigma"]);
  });

  it("detectDrift throws QaError for an invalid date or value", () => {
    expect(() => detectDrift([{ value: 1, at: "not a date" }], limits, "higher-is-worse")).toThrow(/not a valid date/);
    expect(() => detectDrift([{ value: Number.NaN, at: "2025-01-01" }], limits, "higher-is-worse")).toThrow(QaError);
  });

  it("detectDrift on in-control seeded normal data flags few points (rule false-alarm rates are small)", () => {
    // For N(0,1) data a point beyond 3σ has probability 0.0027 (normal table); over 200 points expect ~0.5.
    const rng = createRandom(99);
    const values = Array.from({ length: 200 }, () => 10 + rng.normal());
    const beyond3 = byRule(run(values), "beyond-3-sigma");
    const exact = values.filter((v) => Math.abs(v - 10) > 3).length; // direct count, independent of the rule code
    expect(beyond3.length).toBe(exact);
    expect(exact).toBeLessThanOrEqual(3);
  });
});
