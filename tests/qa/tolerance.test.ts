import { describe, expect, it } from "vitest";
import { evaluateResult, validateTolerance, worstStatus, type Tolerance } from "@/lib/qa/tolerance";
import { QaError } from "@/lib/qa/qa-error";
import { expectClose } from "../helpers/expect-close";

// Reference for every expected status below: hand arithmetic on the two-tier definition (percent of baseline or
// absolute bound, domain notes §5 / IAEA Human Health Series No. 1, 2009 vocabulary) with the module's stated
// boundary rule "reaching a level exactly is that level" (common practice).

const mtf50Relative: Tolerance = { metric: "mtf50", mode: "relative", warning: 10, action: 15, source: "common practice" };
const fwhmRelative: Tolerance = { metric: "fwhmMm", mode: "relative", warning: 10, action: 15, source: "common practice" };
const fwhmAbsolute: Tolerance = { metric: "fwhmMm", mode: "absolute", warning: 1.2, action: 1.4, source: "local decision" };
const mtf50Absolute: Tolerance = { metric: "mtf50", mode: "absolute", warning: 0.45, action: 0.4, source: "local decision" };

describe("evaluateResult, relative mode", () => {
  const base = { mean: 0.5, sd: 0.01 };

  it("evaluateResult(mtf50) classifies values around both levels when lower is worse", () => {
    // 0.45 is 10 % below 0.5 (reaches warning); 0.425 is 15 % below (reaches action) — hand arithmetic.
    expect(evaluateResult(0.45, base, mtf50Relative).status).toBe("warning");
    expect(evaluateResult(0.425, base, mtf50Relative).status).toBe("action");
    expect(evaluateResult(0.4501, base, mtf50Relative).status).toBe("pass"); // 9.98 % below
    expect(evaluateResult(0.4251, base, mtf50Relative).status).toBe("warning"); // 14.98 % below
    expect(evaluateResult(0.3, base, mtf50Relative).status).toBe("action"); // 40 % below
  });

  it("evaluateResult(mtf50) passes any improvement, however large", () => {
    // 20 % and 100 % above baseline are in the good direction for an MTF metric.
    expect(evaluateResult(0.6, base, mtf50Relative).status).toBe("pass");
    expect(evaluateResult(1.0, base, mtf50Relative).status).toBe("pass");
  });

  it("evaluateResult(fwhmMm) treats 15 % wider as action despite binary rounding of 1.15 − 1", () => {
    // 100·(1.15 − 1)/1 evaluates to 14.999999999999991 in IEEE 754 doubles; decimally it is 15 % (action).
    expect((100 * (1.15 - 1)) / 1).toBeLessThan(15);
    expect(evaluateResult(1.15, { mean: 1, sd: null }, fwhmRelative).status).toBe("action");
    expect(evaluateResult(1.1, { mean: 1, sd: null }, fwhmRelative).status).toBe("warning");
    expect(evaluateResult(1.0999, { mean: 1, sd: null }, fwhmRelative).status).toBe("pass");
    expect(evaluateResult(1.1499, { mean: 1, sd: null }, fwhmRelative).status).toBe("warning");
    expect(evaluateResult(0.7, { mean: 1, sd: null }, fwhmRelative).status).toBe("pass"); // narrower is better
  });

  it("evaluateResult reports the signed percent deviation from the baseline mean", () => {
    // 100·(0.45 − 0.5)/0.5 = −10; 100·(2.3 − 2)/2 = +15 (hand arithmetic).
    expectClose(evaluateResult(0.45, base, mtf50Relative).deviationPercent, -10, { abs: 1e-9 });
    expectClose(evaluateResult(2.3, { mean: 2, sd: 0.1 }, fwhmRelative).deviationPercent, 15, { abs: 1e-9 });
  });

  it("evaluateResult honours an explicit direction over the metric's default", () => {
    const reversed: Tolerance = { ...mtf50Relative, direction: "higher-is-worse" };
    expect(evaluateResult(0.575, base, reversed).status).toBe("action"); // 15 % above
    expect(evaluateResult(0.425, base, reversed).status).toBe("pass"); // 15 % below, now the good side
  });

  it("evaluateResult without a baseline in relative mode is not evaluated", () => {
    const r = evaluateResult(0.4, null, mtf50Relative);
    expect(r.status).toBe("no-baseline");
    expect(r.basis).toBe("no-baseline");
    expect(r.deviationPercent).toBeNull();
  });
});

describe("evaluateResult, absolute mode", () => {
  it("evaluateResult(fwhmMm) is warning at 1.2 mm and action at 1.4 mm exactly", () => {
    expect(evaluateResult(1.2, null, fwhmAbsolute).status).toBe("warning");
    expect(evaluateResult(1.4, null, fwhmAbsolute).status).toBe("action");
    expect(evaluateResult(1.19999, null, fwhmAbsolute).status).toBe("pass");
    expect(evaluateResult(1.39999, null, fwhmAbsolute).status).toBe("warning");
    expect(evaluateResult(2, null, fwhmAbsolute).status).toBe("action");
  });

  it("evaluateResult(mtf50) is warning at 0.45 and action at 0.40 cycles/mm when lower is worse", () => {
    expect(evaluateResult(0.45, null, mtf50Absolute).status).toBe("warning");
    expect(evaluateResult(0.4, null, mtf50Absolute).status).toBe("action");
    expect(evaluateResult(0.4500001, null, mtf50Absolute).status).toBe("pass");
    expect(evaluateResult(0.4000001, null, mtf50Absolute).status).toBe("warning");
    expect(evaluateResult(0.1, null, mtf50Absolute).status).toBe("action");
  });

  it("evaluateResult in absolute mode still reports the deviation when a baseline exists", () => {
    const r = evaluateResult(1.3, { mean: 1, sd: 0.05 }, fwhmAbsolute);
    expect(r.status).toBe("warning");
    expectClose(r.deviationPercent, 30, { abs: 1e-9 }); // 100·(1.3 − 1)/1
  });
});

describe("evaluateResult, missing inputs and invalid tolerances", () => {
  it("evaluateResult(null, …) is never a pass", () => {
    const r = evaluateResult(null, { mean: 1, sd: 0.1 }, fwhmRelative);
    expect(r.status).toBe("no-baseline");
    expect(r.basis).toBe("no-value");
    expect(r.deviationPercent).toBeNull();
  });

  it("evaluateResult without a tolerance is not evaluated but keeps the deviation", () => {
    const r = evaluateResult(1.1, { mean: 1, sd: 0.1 }, null);
    expect(r.status).toBe("no-baseline");
    expect(r.basis).toBe("no-tolerance");
    expectClose(r.deviationPercent, 10, { abs: 1e-9 });
  });

  it("evaluateResult throws QaError for NaN and for a relative tolerance on a zero baseline", () => {
    expect(() => evaluateResult(Number.NaN, { mean: 1, sd: null }, fwhmRelative)).toThrow(QaError);
    expect(() => evaluateResult(0.1, { mean: 0, sd: null }, mtf50Relative)).toThrow(/positive baseline mean/);
  });

  it("validateTolerance refuses misordered levels in both modes", () => {
    expect(() => validateTolerance({ ...fwhmRelative, warning: 20, action: 15 })).toThrow(/must not exceed/);
    expect(() => validateTolerance({ ...fwhmRelative, warning: -1 })).toThrow(/≥ 0/);
    expect(() => validateTolerance({ ...fwhmAbsolute, warning: 1.5, action: 1.4 })).toThrow(/worse when higher/);
    expect(() => validateTolerance({ ...mtf50Absolute, warning: 0.35, action: 0.4 })).toThrow(/worse when lower/);
    expect(() => validateTolerance({ ...fwhmAbsolute, action: Number.POSITIVE_INFINITY })).toThrow(/finite/);
    expect(() => validateTolerance(fwhmAbsolute)).not.toThrow();
  });
});

describe("worstStatus", () => {
  it("worstStatus(statuses) orders action > warning > pass > no-baseline", () => {
    expect(worstStatus(["pass", "warning", "no-baseline"])).toBe("warning");
    expect(worstStatus(["pass", "action", "warning"])).toBe("action");
    expect(worstStatus(["no-baseline", "pass"])).toBe("pass");
    expect(worstStatus(["no-baseline"])).toBe("no-baseline");
  });

  it("worstStatus([]) is no-baseline: nothing was evaluated", () => {
    expect(worstStatus([])).toBe("no-baseline");
  });
});
