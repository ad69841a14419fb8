import { describe, expect, it } from "vitest";
import { METRICS, METRIC_KEYS, formatMetric, isMetricKey, metricsForMethod } from "@/lib/qa/metrics";

describe("METRICS", () => {
  it("METRICS directions follow the Gaussian closed forms: wider σ raises FWHM and lowers MTF50/MTF10/MTF(Nyquist)", () => {
    // Gaussian LSF: FWHM = 2.354820σ, FWTM = 4.291932σ, MTF(f) = exp(−2π²σ²f²) (domain notes §6, textbook closed form).
    const measures = (sigma: number) => {
      const mtf = (f: number) => Math.exp(-2 * Math.PI ** 2 * sigma ** 2 * f ** 2);
      return {
        fwhmMm: 2.35482 * sigma,
        fwtmMm: 4.291932 * sigma,
        mtf50: 0.187391 / sigma,
        mtf10: 0.341541 / sigma,
        mtfAtNyquist: mtf(1), // Nyquist of 0.5 mm pixels
      };
    };
    const sharp = measures(0.3);
    const blurred = measures(0.4);
    for (const key of ["fwhmMm", "fwtmMm", "mtf50", "mtf10", "mtfAtNyquist"] as const) {
      const worse = METRICS[key].direction === "higher-is-worse" ? blurred[key] > sharp[key] : blurred[key] < sharp[key];
      expect(worse, key).toBe(true);
    }
  });

  it("METRICS widths are in mm and MTF frequencies in cycles/mm; the MTF value has no unit", () => {
    for (const key of ["fwhmMm", "fwtmMm", "fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm"] as const) {
      expect(METRICS[key].unit).toBe("mm");
      expect(METRICS[key].direction).toBe("higher-is-worse");
    }
    expect(METRICS.mtf50.unit).toBe("cycles/mm");
    expect(METRICS.mtf10.unit).toBe("cycles/mm");
    expect(METRICS.mtfAtNyquist.unit).toBe("");
    for (const key of METRIC_KEYS) expect(METRICS[key].key).toBe(key);
  });

  it("metricsForMethod(method) gives point sources the per-axis widths and line/edge/disk only the five shared metrics", () => {
    // Point sources have x and y profiles (NEMA NU 2 / NU 1 report per direction, domain notes §1–2); the other
    // methods give one profile across the line/edge/disk boundary.
    expect(metricsForMethod("point")).toEqual([...METRIC_KEYS]);
    for (const method of ["line", "edge", "disk"] as const) {
      expect(metricsForMethod(method)).toEqual(["fwhmMm", "fwtmMm", "mtf50", "mtf10", "mtfAtNyquist"]);
    }
  });

  it("isMetricKey(text) accepts catalogue keys only", () => {
    expect(isMetricKey("mtf50")).toBe(true);
    expect(isMetricKey("toString")).toBe(false);
    expect(isMetricKey("mtf20")).toBe(false);
  });

  it("formatMetric(key, value) uses the catalogue digits and unit", () => {
    expect(formatMetric("fwhmMm", 1.2345)).toBe("1.23 mm");
    expect(formatMetric("mtf50", 0.41234)).toBe("0.412 cycles/mm");
    expect(formatMetric("mtfAtNyquist", 0.25)).toBe("0.250");
    expect(formatMetric("mtf10", null)).toBe("—");
  });
});
