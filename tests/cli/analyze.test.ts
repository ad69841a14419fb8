import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PNG } from "pngjs";
import { afterAll, describe, expect, it } from "vitest";
import { ANALYSIS_VERSION } from "@/lib/analysis/types";
import { writeDicom } from "@/lib/imaging/dicom-writer";
import { blurredStepLsf, blurredStepMtf, symmetricWidthMm } from "@/lib/phantoms/blurred-step";
import { diskPresampledMtf, makeDisk } from "@/lib/phantoms/disk";
import { makeSlantedEdge, slantedEdgeMtf } from "@/lib/phantoms/edge";
import { makeGaussianLine } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "@/tests/helpers/expect-close";
import { runPythonJson } from "../imaging/helpers/python-reference";

// Each case spawns the real CLI (tsx scripts/analyze.ts), about a second apiece, so the cases are few and broad.
const ROOT = path.resolve(__dirname, "../..");
const TSX = path.join(ROOT, "node_modules", ".bin", "tsx");
const dir = mkdtempSync(path.join(tmpdir(), "halfmax-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function cli(...args: string[]) {
  const r = spawnSync(TSX, ["scripts/analyze.ts", ...args], { cwd: ROOT, encoding: "utf8", timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function save(name: string, bytes: Uint8Array): string {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  return file;
}

/** The analysis JSON printed by `--json`: exactly one line, one object, nothing on stderr. */
function runJson(...args: string[]): Record<string, any> {
  const r = cli(...args, "--json");
  expect(r.stderr).toBe("");
  expect(r.status).toBe(0);
  const lines = r.stdout.trimEnd().split("\n");
  expect(lines).toHaveLength(1);
  return JSON.parse(lines[0]);
}

/** Frequency where a decreasing closed-form MTF falls to `level`, by bisection (cycles/mm). */
function crossing(mtf: (f: number) => number, level: number, upper: number): number {
  let lo = 0;
  let hi = upper;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (mtf(mid) > level) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Radial average over directions of the presampled MTF of a Gaussian PSF seen through square pixels of pitch p. */
function pointRadialMtf(f: number, sigma: number, p: number): number {
  let sum = 0;
  const n = 90;
  for (let k = 0; k < n; k++) {
    const t = ((k + 0.5) / n) * (Math.PI / 2);
    sum += Math.abs(blurredStepMtf(f, sigma, p * Math.cos(t), p * Math.sin(t)));
  }
  return sum / n;
}

const KEYS = ["method", "pixelSpacingMm", "fwhmMm", "fwtmMm", "mtf50", "mtf10", "nyquist", "mtfAtNyquist", "mtf", "warnings", "version", "timingMs"];

describe("analyze CLI --json on phantom DICOMs (values against the phantoms' closed forms)", () => {
  it("analyze point.dcm --json: FWHM within 3 % and MTF50 within 3 % of the pixel-integrated Gaussian", () => {
    const sigma = 0.5;
    const p = 0.2;
    const phantom = makeGaussianPoint({ width: 128, height: 128, pixelSpacingMm: p, sigmaXMm: sigma, centreXPx: 63.3, centreYPx: 64.7, amplitude: 1000, background: 100, noiseSd: 3, seed: 21 });
    const file = save("point.dcm", writeDicom(phantom.image, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM" }));
    const json = runJson(file, "--method", "point");
    for (const key of [...KEYS, "fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm"]) expect(json).toHaveProperty(key);
    expect(json.method).toBe("point");
    expect(json.version).toBe(ANALYSIS_VERSION);
    expect(json.pixelSpacingMm).toEqual([p, p]);
    expect(json.nyquist).toBeCloseTo(1 / (2 * p), 12); // Nyquist 1/(2p)
    expect(Object.keys(json.timingMs).sort()).toEqual(["analysis", "decode"]);
    expect(json.mtf.frequency.length).toBe(json.mtf.value.length);
    // Presampled profile = Gaussian ∗ rect(p) (closed form, erf differences); its FWHM by bisection.
    const fwhm = symmetricWidthMm((d) => blurredStepLsf(d, sigma, p, 0), 0.5, sigma);
    expectClose(json.fwhmMm, fwhm, { rel: 0.03 });
    expectClose(json.fwhmXMm, fwhm, { rel: 0.03 });
    expectClose(json.fwhmYMm, fwhm, { rel: 0.03 });
    // Radial MTF = direction average of e^(−2π²σ²f²)·sinc(p f cos θ)·sinc(p f sin θ).
    expectClose(json.mtf50, crossing((f) => pointRadialMtf(f, sigma, p), 0.5, 5), { rel: 0.03 });
  });

  it("analyze line.dcm (Implicit VR, tilted 2°) --json: FWHM, MTF50 and the line angle", () => {
    const sigma = 0.6;
    const p = 0.25;
    const angle = 2;
    const phantom = makeGaussianLine({ width: 128, height: 128, pixelSpacingMm: p, angleDeg: angle, sigmaMm: sigma, centreXPx: 64.3, amplitude: 800, background: 40, noiseSd: 2, seed: 22 });
    const file = save("line.dcm", writeDicom(phantom.image, { transferSyntax: "implicit-le", bitsAllocated: 16, signed: false, modality: "NM" }));
    const json = runJson(file, "--method", "line");
    expect(json.method).toBe("line");
    // Presampled LSF across the line: Gaussian ∗ rect(p cos θ) ∗ rect(p sin θ); MTF the product of their transforms.
    const t = (angle * Math.PI) / 180;
    const [a, b] = [p * Math.cos(t), p * Math.sin(t)];
    expectClose(json.fwhmMm, symmetricWidthMm((d) => blurredStepLsf(d, sigma, a, b), 0.5, sigma), { rel: 0.03 });
    expectClose(json.mtf50, crossing((f) => Math.abs(blurredStepMtf(f, sigma, a, b)), 0.5, 4), { rel: 0.03 });
    expectClose(json.edgeAngleDeg, angle, { abs: 0.2 });
  });

  it("analyze edge.dcm (Explicit VR Big Endian, 3°) --json: MTF50 within 2 % of e^(−2π²σ²f²)·sinc·sinc", () => {
    const phantom = makeSlantedEdge({ width: 300, height: 300, pixelSpacingMm: 0.1, angleDeg: 3, sigmaMm: 0.12, low: 200, high: 1800, noiseSd: 2, seed: 23 });
    const file = save("edge.dcm", writeDicom(phantom.image, { transferSyntax: "explicit-be", bitsAllocated: 16, signed: false, modality: "DX", useImagerPixelSpacing: true }));
    const json = runJson(file, "--method", "edge");
    expect(json.method).toBe("edge");
    expect(json.warnings.map((w: { code: string }) => w.code)).toContain("imager_pixel_spacing");
    expectClose(json.mtf50, crossing((f) => slantedEdgeMtf(phantom.truth, f), 0.5, 10), { rel: 0.02 });
    expectClose(json.mtf10, crossing((f) => slantedEdgeMtf(phantom.truth, f), 0.1, 10), { rel: 0.03 });
    expectClose(json.edgeAngleDeg, 3, { abs: 0.1 });
  });

  it("analyze disk.dcm (signed CT with rescale, auto method) --json: chooses disk, MTF50 within 3 %", () => {
    const sigma = 0.35;
    const p = 0.2;
    const phantom = makeDisk({ width: 256, height: 256, pixelSpacingMm: p, radiusMm: 12, centreXPx: 127.4, centreYPx: 128.3, sigmaMm: sigma, insideValue: 120, outsideValue: -880, noiseSd: 2, seed: 24 });
    const file = save("disk.dcm", writeDicom(phantom.image, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: true, modality: "CT" }));
    const json = runJson(file);
    expect(json.method).toBe("disk");
    expectClose(json.mtf50, crossing((f) => diskPresampledMtf(f, sigma, { x: p, y: p }), 0.5, 5), { rel: 0.03 });
  });

  it("analyze volume.dcm (3 frames, source in the middle one) picks that frame by itself", () => {
    const sigma = 0.5;
    const p = 0.2;
    const random = createRandom(25);
    const source = makeGaussianPoint({ width: 96, height: 96, pixelSpacingMm: p, sigmaXMm: sigma, centreXPx: 47.6, centreYPx: 48.2, amplitude: 900, background: 100, noiseSd: 2, seed: 26 }).image.data;
    const flat = () => Float64Array.from({ length: 96 * 96 }, () => 100 + 2 * random.normal());
    const data = new Float64Array([...flat(), ...source, ...flat()]);
    const file = save("volume.dcm", writeDicom({ width: 96, height: 96, frames: 3, data, pixelSpacingMm: { x: p, y: p } }, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM" }));
    const json = runJson(file, "--method", "point");
    expectClose(json.fwhmMm, symmetricWidthMm((d) => blurredStepLsf(d, sigma, p, 0), 0.5, sigma), { rel: 0.03 });
  });

  it("analyze point.png --pixel-spacing 0.3,0.15 --json: uses row,column order and reports [row, col]", () => {
    // Anisotropic pixels: 0.15 mm along x (columns), 0.3 mm along y (rows); 16-bit PNG written by pngjs.
    const spacing = { x: 0.15, y: 0.3 };
    const sigma = 0.6;
    const phantom = makeGaussianPoint({ width: 120, height: 64, pixelSpacingMm: spacing, sigmaXMm: sigma, centreXPx: 60.4, centreYPx: 31.8, amplitude: 30000, background: 1000, noiseSd: 20, seed: 27 });
    const png = new PNG({ width: 120, height: 64, bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false });
    png.data = Buffer.from(Uint16Array.from(phantom.image.data, (v) => Math.round(v)).buffer);
    const file = save("point.png", new Uint8Array(PNG.sync.write(png, { bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false })));
    const json = runJson(file, "--method", "point", "--pixel-spacing", "0.3,0.15");
    expect(json.pixelSpacingMm).toEqual([0.3, 0.15]);
    expectClose(json.fwhmXMm, symmetricWidthMm((d) => blurredStepLsf(d, sigma, spacing.x, 0), 0.5, sigma), { rel: 0.03 });
    expectClose(json.fwhmYMm, symmetricWidthMm((d) => blurredStepLsf(d, sigma, spacing.y, 0), 0.5, sigma), { rel: 0.03 });
  });
});

describe("analyze CLI --inspect and text output", () => {
  it("analyze ct.dcm --inspect: geometry and rescaled statistics equal pydicom's", () => {
    const random = createRandom(28);
    const data = Float64Array.from({ length: 40 * 30 }, () => -1000 + 2500 * random.uniform());
    const file = save("ct.dcm", writeDicom({ width: 40, height: 30, data, pixelSpacingMm: { x: 0.7, y: 0.6 } }, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: true, modality: "CT" }));
    const r = cli(file, "--inspect");
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    const inspect = JSON.parse(r.stdout);
    const ref = runPythonJson<{ min: number; max: number; mean: number; rows: number; columns: number; spacing: number[] }>(
      `
import sys, json, pydicom
from pydicom.pixel_data_handlers.util import apply_modality_lut
ds = pydicom.dcmread(sys.argv[1]); v = apply_modality_lut(ds.pixel_array, ds)
print(json.dumps({"min": float(v.min()), "max": float(v.max()), "mean": float(v.mean()), "rows": int(ds.Rows), "columns": int(ds.Columns), "spacing": [float(x) for x in ds.PixelSpacing]}))
`,
      [file],
    );
    expect([inspect.rows, inspect.columns, inspect.frames]).toEqual([ref.rows, ref.columns, 1]);
    expect(inspect.pixelSpacingMm).toEqual(ref.spacing);
    expectClose(inspect.min, ref.min, { abs: 1e-9 });
    expectClose(inspect.max, ref.max, { abs: 1e-9 });
    expectClose(inspect.mean, ref.mean, { rel: 1e-12 });
    expect(inspect.transferSyntaxUid).toBe("1.2.840.10008.1.2.1");
    expect(inspect.modality).toBe("CT");
    expect(inspect.photometricInterpretation).toBe("MONOCHROME2");
    expect(inspect.warnings).toEqual([]);
  });

  it("analyze image.raw --raw 5x4x2:int16 --inspect reads headerless little-endian samples", () => {
    const values = Array.from({ length: 40 }, (_, i) => (i % 2 ? -1 : 1) * i * 100);
    const file = save("image.raw", new Uint8Array(Int16Array.from(values).buffer));
    const r = cli(file, "--raw", "5x4x2:int16", "--inspect");
    expect(r.status).toBe(0);
    const inspect = JSON.parse(r.stdout);
    expect([inspect.columns, inspect.rows, inspect.frames]).toEqual([5, 4, 2]);
    expect([inspect.min, inspect.max]).toEqual([Math.min(...values), Math.max(...values)]);
    expectClose(inspect.mean, values.reduce((s, v) => s + v, 0) / 40, { abs: 1e-12 });
    expect(inspect.pixelSpacingMm).toBeNull();
  });

  it("analyze point.dcm (no flags) prints a readable table with units, version and an MTF table", () => {
    const phantom = makeGaussianPoint({ width: 64, height: 64, pixelSpacingMm: 0.25, sigmaXMm: 0.6, centreXPx: 31.5, centreYPx: 32.2, amplitude: 1000, background: 100, seed: 29 });
    const r = cli(save("point-text.dcm", writeDicom(phantom.image, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM" })));
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    for (const text of ["FWHM", "FWTM", "MTF50", "MTF10", "MTF at Nyquist", "lp/mm", " mm", "Pixel spacing", ANALYSIS_VERSION, "f/Nyquist"]) {
      expect(r.stdout).toContain(text);
    }
  });
});

describe("analyze CLI bad input: exit code 2, one line on stderr, nothing on stdout", () => {
  const garbage = () => save("garbage.bin", Uint8Array.from({ length: 2000 }, (_, i) => (i * 7919) % 251));
  const flatPng = () => {
    const png = new PNG({ width: 64, height: 64, colorType: 0, inputColorType: 0, inputHasAlpha: false });
    png.data = Buffer.alloc(64 * 64, 50);
    return save("flat.png", new Uint8Array(PNG.sync.write(png, { colorType: 0, inputColorType: 0, inputHasAlpha: false })));
  };
  // Each case makes its own input, so any subset of the cases can run alone.
  const volume = () => save("three-frames.dcm", writeDicom({ width: 16, height: 16, frames: 3, data: new Float64Array(768).fill(5), pixelSpacingMm: { x: 1, y: 1 } }, {
    transferSyntax: "explicit-le", bitsAllocated: 8, signed: false, modality: "NM",
  }));
  const cases: [string, () => string[], string][] = [
    ["a missing file", () => [path.join(dir, "does-not-exist.dcm")], "no such file"],
    ["unrecognised bytes", () => [garbage()], "unrecognised file format"],
    ["a PNG without --pixel-spacing", () => [flatPng()], "--pixel-spacing"],
    ["a flat image analysed as a point source", () => [flatPng(), "--method", "point", "--pixel-spacing", "0.2"], ""],
    ["an unknown --method", () => [volume(), "--method", "blob"], "--method"],
    ["a malformed --roi", () => [volume(), "--roi", "1,2,3"], "--roi"],
    ["--frame beyond the last frame", () => [volume(), "--frame", "4"], "3 frame(s)"],
    [
      "an --roi that leaves out the point source (so the ROI reaches the analysis)",
      () => {
        const phantom = makeGaussianPoint({ width: 64, height: 64, pixelSpacingMm: 0.25, sigmaXMm: 0.6, centreXPx: 45, centreYPx: 45, amplitude: 1000, background: 100, noiseSd: 2, seed: 30 });
        const file = save("point-corner.dcm", writeDicom(phantom.image, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM" }));
        return [file, "--method", "point", "--roi", "0,0,20,20"];
      },
      "",
    ],
  ];
  it.each(cases)("analyze with %s exits 2 with a clear message", (_, args, mention) => {
    const r = cli(...args());
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^halfmax analyze: .{10,}/);
    expect(lines[0]).toContain(mention);
  });
});
