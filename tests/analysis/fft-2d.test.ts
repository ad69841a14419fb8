import { describe, expect, it } from "vitest";
import { fft as mathjsFft, type Complex } from "mathjs";
import { AnalysisError } from "@/lib/analysis/errors";
import {
  amplitudeSpectrum2d,
  normaliseAtZeroFrequency,
  spectrumAxisCut,
  spectrumRadialAverage,
} from "@/lib/analysis/fft-2d";
import type { GrayImage } from "@/lib/analysis/types";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

function image(width: number, height: number, value: (x: number, y: number) => number, spacing = { x: 1, y: 1 }): GrayImage {
  const data = new Float64Array(width * height);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) data[y * width + x] = value(x, y);
  return { data, width, height, pixelSpacingMm: spacing };
}

describe("amplitudeSpectrum2d(image, padding)", () => {
  it("turns an impulse into a flat spectrum wherever the impulse sits", () => {
    // DFT of δ(x − x0, y − y0) is e^(−2πi(…)): magnitude 1 in every bin (Bracewell, The Fourier Transform and
    // Its Applications, shift theorem).
    for (const [x0, y0] of [[0, 0], [3, 5], [7, 1]] as const) {
      const spectrum = amplitudeSpectrum2d(image(8, 6, (x, y) => (x === x0 && y === y0 ? 1 : 0)), { paddedWidth: 8, paddedHeight: 8 });
      for (const m of spectrum.magnitude) expectClose(m, 1, { abs: 1e-12 });
    }
  });

  it("matches the magnitude of mathjs fft of the zero-padded image", () => {
    // Reference: mathjs `fft` (independent general-purpose N-dimensional FFT) on the same zero-padded 16×16 array.
    const random = createRandom(42);
    const input = image(12, 10, () => random.normal());
    const spectrum = amplitudeSpectrum2d(input);
    expect([spectrum.width, spectrum.height]).toEqual([16, 16]);
    const padded: number[][] = [];
    for (let y = 0; y < 16; y++) {
      const row: number[] = [];
      for (let x = 0; x < 16; x++) row.push(x < 12 && y < 10 ? input.data[y * 12 + x]! : 0);
      padded.push(row);
    }
    const reference = mathjsFft(padded) as unknown as Complex[][];
    for (let ky = 0; ky < 16; ky++) {
      for (let kx = 0; kx < 16; kx++) {
        const c = reference[ky]![kx]!;
        expectClose(spectrum.magnitude[ky * 16 + kx], Math.hypot(c.re, c.im), { abs: 1e-10 });
      }
    }
  });

  it("conserves energy (Parseval: Σ|f|² = Σ|F|² / (Nx·Ny))", () => {
    // Parseval's theorem for the DFT (Bracewell); zero padding adds no energy.
    const random = createRandom(7);
    const input = image(20, 13, () => random.uniform() - 0.3);
    const spectrum = amplitudeSpectrum2d(input, { paddedWidth: 64, paddedHeight: 32 });
    const spatial = input.data.reduce((s, v) => s + v * v, 0);
    const spectral = spectrum.magnitude.reduce((s, m) => s + m * m, 0) / (64 * 32);
    expectClose(spectral, spatial, { rel: 1e-12 });
  });

  it("uses frequency steps 1/(N·p) per axis with each axis' spacing", () => {
    // DFT sampling: bin step = 1/(N·Δx) (domain notes §6, "DFT step = 1/(NΔx)").
    const spectrum = amplitudeSpectrum2d(image(10, 20, () => 1, { x: 0.25, y: 0.8 }), { paddedWidth: 32, paddedHeight: 64 });
    expectClose(spectrum.frequencyStepXCyclesPerMm, 1 / (32 * 0.25), { rel: 1e-15 });
    expectClose(spectrum.frequencyStepYCyclesPerMm, 1 / (64 * 0.8), { rel: 1e-15 });
    const cutX = spectrumAxisCut(spectrum, "x");
    const cutY = spectrumAxisCut(spectrum, "y");
    expect(cutX.frequencyCyclesPerMm).toHaveLength(17);
    expectClose(cutX.frequencyCyclesPerMm.at(-1), 1 / (2 * 0.25), { rel: 1e-15 }); // folding frequency 1/(2p)
    expectClose(cutY.frequencyCyclesPerMm.at(-1), 1 / (2 * 0.8), { rel: 1e-15 });
  });

  it("throws AnalysisError for padding smaller than the image", () => {
    expect(() => amplitudeSpectrum2d(image(20, 8, () => 0), { paddedWidth: 16 })).toThrow(AnalysisError);
    expect(() => amplitudeSpectrum2d(image(8, 8, () => 0), { paddedWidth: 12 })).toThrow(/power of two/);
  });
});

describe("spectrumAxisCut(spectrum, axis)", () => {
  it("equals the 1-D spectrum of the projection along the other axis (central-slice theorem)", () => {
    // Central-slice theorem (domain notes §6; Bracewell): the v = 0 cut of the 2-D DFT is the 1-D DFT of the
    // column sums. Reference 1-D DFT: mathjs fft.
    const random = createRandom(3);
    const input = image(16, 8, () => random.uniform());
    const spectrum = amplitudeSpectrum2d(input);
    const projection = Array.from({ length: 16 }, (_, x) => {
      let s = 0;
      for (let y = 0; y < 8; y++) s += input.data[y * 16 + x]!;
      return s;
    });
    const reference = mathjsFft(projection) as unknown as Complex[];
    const cut = spectrumAxisCut(spectrum, "x");
    for (let k = 0; k <= 8; k++) expectClose(cut.value[k], Math.hypot(reference[k]!.re, reference[k]!.im), { abs: 1e-10 });
  });
});

describe("spectrumRadialAverage(spectrum)", () => {
  it("recovers exp(−2π²σ²f²) of a sampled isotropic Gaussian at each ring's nominal radius", () => {
    // Closed form: the FT of exp(−r²/2σ²) is 2πσ²·exp(−2π²σ²f²) (Bracewell); sampled at σ = 3 px, aliasing is
    // below 1e-30. Centred in a 64×64 frame, so truncation is below e^(−50).
    const sigma = 3;
    const input = image(64, 64, (x, y) => Math.exp(-((x - 32) ** 2 + (y - 32) ** 2) / (2 * sigma * sigma)), { x: 0.5, y: 0.5 });
    const radial = normaliseAtZeroFrequency(spectrumRadialAverage(amplitudeSpectrum2d(input, { paddedWidth: 128, paddedHeight: 128 })));
    expect(radial.value[0]).toBe(1); // MTF(0) = 1 by normalisation
    expect(radial.frequencyCyclesPerMm).toHaveLength(65);
    expectClose(radial.frequencyCyclesPerMm.at(-1), 1, { rel: 1e-12 }); // last ring at the folding frequency 1/(2·0.5 mm)
    const sigmaMm = sigma * 0.5;
    radial.frequencyCyclesPerMm.forEach((f, i) => {
      expectClose(radial.value[i], Math.exp(-2 * Math.PI ** 2 * sigmaMm ** 2 * f * f), { abs: 2e-3 });
    });
  });
});

describe("normaliseAtZeroFrequency(curve)", () => {
  it("divides by the zero-frequency value and throws AnalysisError when it is not positive", () => {
    // Definition: MTF(f) = |H(f)| / |H(0)|.
    const curve = normaliseAtZeroFrequency({ frequencyCyclesPerMm: [0, 1, 2], value: [4, 2, 1] });
    expect(curve.value).toEqual([1, 0.5, 0.25]);
    expect(() => normaliseAtZeroFrequency({ frequencyCyclesPerMm: [0, 1], value: [0, 1] })).toThrow(AnalysisError);
  });
});
