import { describe, expect, it } from "vitest";
import { erf as mathjsErf } from "mathjs";
import { erf, erfc, normalCdf, normalIntervalProbability } from "@/lib/analysis/special-functions";
import { expectClose } from "../helpers/expect-close";

describe("erf(x) and erfc(x)", () => {
  it("erf(x) agrees with mathjs erf to 1e-14 on [−6, 6]", () => {
    // Reference: mathjs erf (independent general-purpose library).
    for (let x = -6; x <= 6; x += 0.0137) {
      expectClose(erf(x), mathjsErf(x), { abs: 1e-14 });
    }
  });

  it("erf(x) matches tabulated values", () => {
    // Abramowitz & Stegun (1964) Table 7.1, erf to 10 decimals.
    expectClose(erf(0.5), 0.5204998778, { abs: 1e-10 });
    expectClose(erf(1), 0.8427007929, { abs: 1e-10 });
    expectClose(erf(1.5), 0.9661051465, { abs: 1e-10 });
    expectClose(erf(2), 0.9953222650, { abs: 1e-10 });
    expect(erf(-1)).toBe(-erf(1)); // odd function (definition)
    expect(erf(0)).toBe(0);
  });

  it("erfc(x) keeps relative precision deep in the tail", () => {
    // Reference values of erfc from the asymptotic expansion, A&S 7.1.23, evaluated to 5 terms (relative truncation
    // error < 945/(32x¹⁰) < 5e-7 at x ≥ 6): erfc(x) ≈ e^(−x²)/(x√π)·(1 − 1/(2x²) + 3/(4x⁴) − 15/(8x⁶) + 105/(16x⁸)).
    for (const x of [6, 8, 12, 20]) {
      const series = 1 - 1 / (2 * x * x) + 3 / (4 * x ** 4) - 15 / (8 * x ** 6) + 105 / (16 * x ** 8);
      const asymptotic = (Math.exp(-x * x) / (x * Math.sqrt(Math.PI))) * series;
      expectClose(erfc(x), asymptotic, { rel: 1e-6 });
    }
    // A&S Table 7.1 / common tables: erfc(3) = 2.209049699858544e-5 (from memory, cross-checked by mathjs 1 − erf(3)).
    expectClose(erfc(3), 1 - mathjsErf(3), { rel: 1e-9 });
    expectClose(erfc(-2) + erfc(2), 2, { abs: 1e-15 }); // erfc(−x) = 2 − erfc(x) (definition)
  });

  it("normalCdf(z) and normalIntervalProbability(a, b, mean, sigma) give standard normal probabilities", () => {
    // Standard normal table (any statistics text): Φ(1.96) = 0.9750021, Φ(−1) = 0.1586553.
    expectClose(normalCdf(1.96), 0.9750021048517795, { abs: 1e-12 });
    expectClose(normalCdf(-1), 0.15865525393145707, { abs: 1e-12 });
    // 68–95–99.7 rule: P(|z| < 1) = erf(1/√2) = 0.682689492.
    expectClose(normalIntervalProbability(-1, 1, 0, 1), 0.6826894921370859, { abs: 1e-12 });
    // Tail interval computed from erfc keeps relative precision: P(8 < z < 9) = Φ(−8) − Φ(−9).
    const tail = normalIntervalProbability(8, 9, 0, 1);
    expectClose(tail, 0.5 * erfc(8 / Math.SQRT2) - 0.5 * erfc(9 / Math.SQRT2), { rel: 1e-12 });
    expectClose(tail, 6.220960574271785e-16 - 1.1285884059538408e-19, { rel: 1e-9 }); // Φ(−8), Φ(−9): from memory
  });
});
