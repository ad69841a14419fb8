/**
 * 2-D amplitude spectrum of a real image (row transforms, then column transforms, with fft.js plans from fft.ts),
 * and the 1-D curves cut from it: along the x and y frequency axes and the radial average.
 *
 * Conventions: the image is zero-padded at the end of each row and column to powers of two; bin (kx, ky) holds
 * |Σ f(x, y)·e^(−2πi(kx·x/Nx + ky·y/Ny))| (no normalisation, DC at index 0, not shifted); frequency of bin kx is
 * kx / (Nx·px) cycles/mm for kx ≤ Nx/2 and (kx − Nx) / (Nx·px) above, likewise for y with the row spacing py.
 */
import { AnalysisError } from "./errors";
import { fftPlan, nextPowerOfTwo } from "./fft";
import type { GrayImage, MtfCurve } from "./types";

export interface AmplitudeSpectrum2d {
  /** |DFT|, row-major: magnitude[ky * width + kx]. */
  magnitude: Float64Array;
  /** Padded number of columns Nx (power of two). */
  width: number;
  /** Padded number of rows Ny (power of two). */
  height: number;
  /** Frequency step along x, 1/(Nx·px), cycles/mm. */
  frequencyStepXCyclesPerMm: number;
  /** Frequency step along y, 1/(Ny·py), cycles/mm. */
  frequencyStepYCyclesPerMm: number;
}

export interface SpectrumPadding {
  /** Padded width (power of two ≥ image width); default the next power of two. */
  paddedWidth?: number;
  /** Padded height (power of two ≥ image height); default the next power of two. */
  paddedHeight?: number;
}

/**
 * Amplitude spectrum |DFT| of a real image, zero-padded to powers of two.
 *
 * @param image row-major values and pixel spacing (mm) used for the frequency steps.
 * @param padding optional padded sizes (powers of two, not smaller than the image).
 * @throws AnalysisError when a padded size is not a power of two or is smaller than the image, or the data length
 *   does not match width × height.
 */
export function amplitudeSpectrum2d(image: GrayImage, padding: SpectrumPadding = {}): AmplitudeSpectrum2d {
  const { data, width, height } = image;
  if (data.length !== width * height) {
    throw new AnalysisError(`image data length ${data.length} does not match ${width}×${height}`);
  }
  const nx = padding.paddedWidth ?? nextPowerOfTwo(width);
  const ny = padding.paddedHeight ?? nextPowerOfTwo(height);
  if (nx < width || ny < height) {
    throw new AnalysisError(`padded spectrum ${nx}×${ny} is smaller than the ${width}×${height} image`);
  }
  const rowPlan = fftPlan(nx);
  const columnPlan = fftPlan(ny);

  // Complex working image, interleaved re/im, row-major nx × ny. Rows below the image stay zero after the row pass.
  const work = new Float64Array(2 * nx * ny);
  const rowIn = new Float64Array(2 * nx);
  const rowOut = new Float64Array(2 * nx);
  for (let y = 0; y < height; y++) {
    rowIn.fill(0);
    const offset = y * width;
    for (let x = 0; x < width; x++) rowIn[2 * x] = data[offset + x]!;
    rowPlan.transform(rowOut, rowIn);
    work.set(rowOut, 2 * nx * y);
  }

  const magnitude = new Float64Array(nx * ny);
  const columnIn = new Float64Array(2 * ny);
  const columnOut = new Float64Array(2 * ny);
  for (let kx = 0; kx < nx; kx++) {
    for (let y = 0; y < ny; y++) {
      columnIn[2 * y] = work[2 * (y * nx + kx)]!;
      columnIn[2 * y + 1] = work[2 * (y * nx + kx) + 1]!;
    }
    columnPlan.transform(columnOut, columnIn);
    // √(re² + im²) rather than Math.hypot, whose overflow guard costs about ten times more per bin.
    for (let ky = 0; ky < ny; ky++) magnitude[ky * nx + kx] = Math.sqrt(columnOut[2 * ky]! ** 2 + columnOut[2 * ky + 1]! ** 2);
  }

  return {
    magnitude,
    width: nx,
    height: ny,
    frequencyStepXCyclesPerMm: 1 / (nx * image.pixelSpacingMm.x),
    frequencyStepYCyclesPerMm: 1 / (ny * image.pixelSpacingMm.y),
  };
}

/**
 * Cut of the spectrum along one frequency axis through the origin (ky = 0 for "x", kx = 0 for "y"), bins 0 … N/2,
 * i.e. from 0 to that axis' folding frequency 1/(2p). Values are raw magnitudes (not normalised). Never throws.
 */
export function spectrumAxisCut(spectrum: AmplitudeSpectrum2d, axis: "x" | "y"): MtfCurve {
  const n = axis === "x" ? spectrum.width : spectrum.height;
  const step = axis === "x" ? spectrum.frequencyStepXCyclesPerMm : spectrum.frequencyStepYCyclesPerMm;
  const stride = axis === "x" ? 1 : spectrum.width;
  const frequencyCyclesPerMm: number[] = [];
  const value: number[] = [];
  for (let k = 0; k <= n / 2; k++) {
    frequencyCyclesPerMm.push(k * step);
    value.push(spectrum.magnitude[k * stride]!);
  }
  return { frequencyCyclesPerMm, value };
}

/**
 * Radial average of the spectrum: every bin (kx, ky) at radius r = √(u² + v²) (cycles/mm) joins ring
 * round(r / Δ), Δ = max(Δu, Δv) (the coarser frequency step), except that ring 0 is the DC bin alone; rings run up to
 * the smaller of the two folding frequencies, so every ring is a full circle. Ring k reports its value at the nominal
 * radius k·Δ: the bins of a ring sit at scattered radii (ring 1 of a square grid averages r = Δ and r = √2·Δ), so the
 * value is the intercept at k·Δ of a least-squares line through (r, magnitude) of the ring's bins, i.e. the ring mean
 * corrected to first order for the offset of its mean radius (common practice: local linear regression). Values are
 * raw magnitudes. Never throws.
 */
export function spectrumRadialAverage(spectrum: AmplitudeSpectrum2d): MtfCurve {
  const { width: nx, height: ny, magnitude } = spectrum;
  const du = spectrum.frequencyStepXCyclesPerMm;
  const dv = spectrum.frequencyStepYCyclesPerMm;
  const ringWidth = Math.max(du, dv);
  const maxRadius = Math.min((nx / 2) * du, (ny / 2) * dv);
  const ringCount = Math.floor(maxRadius / ringWidth + 1e-9) + 1;
  // Per ring: count, Σt, Σt², Σm, Σt·m with t = r/Δ − k (offset from the nominal radius, in ring widths).
  const count = new Float64Array(ringCount);
  const sumT = new Float64Array(ringCount);
  const sumTT = new Float64Array(ringCount);
  const sumM = new Float64Array(ringCount);
  const sumTM = new Float64Array(ringCount);
  for (let ky = 0; ky < ny; ky++) {
    const v = (ky <= ny / 2 ? ky : ky - ny) * dv;
    for (let kx = 0; kx < nx; kx++) {
      const u = (kx <= nx / 2 ? kx : kx - nx) * du;
      const radius = Math.sqrt(u * u + v * v) / ringWidth;
      const ring = radius === 0 ? 0 : Math.max(1, Math.round(radius));
      if (ring >= ringCount) continue;
      const t = radius - ring;
      const m = magnitude[ky * nx + kx]!;
      count[ring] += 1;
      sumT[ring] += t;
      sumTT[ring] += t * t;
      sumM[ring] += m;
      sumTM[ring] += t * m;
    }
  }
  const frequencyCyclesPerMm: number[] = [];
  const value: number[] = [];
  for (let ring = 0; ring < ringCount; ring++) {
    const n = count[ring]!;
    if (n === 0) continue;
    const meanT = sumT[ring]! / n;
    const meanM = sumM[ring]! / n;
    const varianceT = sumTT[ring]! / n - meanT * meanT;
    // With a single radius in the ring there is no slope to estimate: the ring mean is the estimate.
    const slope = varianceT > 1e-12 ? (sumTM[ring]! / n - meanT * meanM) / varianceT : 0;
    frequencyCyclesPerMm.push(ring * ringWidth);
    value.push(meanM - slope * meanT);
  }
  return { frequencyCyclesPerMm, value };
}

/**
 * Divides a curve by its value at zero frequency (its first sample) so that it is 1 at f = 0.
 * @throws AnalysisError when the first sample is not at f = 0 or its value is not positive.
 */
export function normaliseAtZeroFrequency(curve: MtfCurve): MtfCurve {
  const first = curve.value[0];
  if (curve.frequencyCyclesPerMm[0] !== 0 || first === undefined || !(first > 0)) {
    throw new AnalysisError(`cannot normalise an MTF whose zero-frequency value is ${first}; is the background subtracted correctly?`);
  }
  return { frequencyCyclesPerMm: [...curve.frequencyCyclesPerMm], value: curve.value.map((m) => m / first) };
}
