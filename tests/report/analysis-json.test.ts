import { describe, expect, it } from "vitest";
import { ANALYSIS_VERSION, type AnalysisResult } from "@/lib/analysis/types";
import { toAnalysisJson } from "@/lib/report/analysis-json";

const base: AnalysisResult = {
  method: "point",
  version: ANALYSIS_VERSION,
  pixelSpacingMm: { x: 0.3, y: 0.7 },
  fwhmMm: 1.5,
  fwtmMm: 2.7,
  fwhmXMm: 1.4,
  fwhmYMm: 1.6,
  fwtmXMm: 2.6,
  fwtmYMm: 2.8,
  mtf50: 0.29,
  mtf10: 0.53,
  nyquist: 1 / 0.6,
  mtfAtNyquist: 0.01,
  mtf: { frequencyCyclesPerMm: [0, 0.5, 1], value: [1, 0.4, 0.05] },
  spread: [],
  roi: { x: 0, y: 0, width: 10, height: 10 },
  warnings: [{ code: "low_snr", message: "noisy" }],
  details: { anything: 1 },
};

describe("toAnalysisJson(result, timing, extraWarnings)", () => {
  it("toAnalysisJson(point result) gives pixelSpacingMm as [row, col] = [y, x] (DICOM PS3.3 §10.7.1.3 order)", () => {
    expect(toAnalysisJson(base).pixelSpacingMm).toEqual([0.7, 0.3]);
  });

  it("toAnalysisJson(point result) has exactly the documented keys in order, per-axis widths included", () => {
    const json = toAnalysisJson(base, { decode: 1.5, analysis: 2.5 }, [{ code: "imager_pixel_spacing", message: "detector plane" }]);
    expect(Object.keys(json)).toEqual([
      "method", "pixelSpacingMm", "fwhmMm", "fwtmMm", "fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm",
      "mtf50", "mtf10", "nyquist", "mtfAtNyquist", "mtf", "warnings", "version", "timingMs",
    ]);
    expect(json.mtf).toEqual({ frequency: [0, 0.5, 1], value: [1, 0.4, 0.05] });
    expect(json.warnings.map((w) => w.code)).toEqual(["imager_pixel_spacing", "low_snr"]);
    expect(json.timingMs).toEqual({ decode: 1.5, analysis: 2.5 });
  });

  it("toAnalysisJson(edge result) omits per-axis widths and timing, keeps edgeAngleDeg and null FWHM", () => {
    const edge: AnalysisResult = { ...base, method: "edge", fwhmMm: null, fwtmMm: null, edgeAngleDeg: 2.5 };
    delete edge.fwhmXMm;
    delete edge.fwhmYMm;
    delete edge.fwtmXMm;
    delete edge.fwtmYMm;
    const json = toAnalysisJson(edge);
    expect(json).not.toHaveProperty("fwhmXMm");
    expect(json).not.toHaveProperty("timingMs");
    expect(json.edgeAngleDeg).toBe(2.5);
    expect(json.fwhmMm).toBeNull();
    expect(JSON.parse(JSON.stringify(json))).toEqual(json); // plain JSON data
  });
});
