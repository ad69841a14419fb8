/**
 * Line-source (wire, capillary, slit) analysis: LSF, FWHM/FWTM by the NEMA NU 1 / NU 2 direct method, and the
 * presampled MTF along the line normal.
 *
 * Procedure:
 * 1. orientation: the line is near-vertical when the column means (averaged along y) are more peaked than the row
 *    means (max − median), near-horizontal otherwise; "along" is then the line's axis and "across" the other;
 * 2. background level and noise from 3-px border strips of the ROI parallel to the line (median, 1.4826·MAD);
 * 3. line position: coarse centroids of 8 blocks of lines, then per-line centroids of the background-subtracted values
 *    within ±max(3 px, 2 FWHM) of the current fit, and a least-squares straight line c(a) = c₀ + b·a through them,
 *    repeated 3 times (the centroid + line-fit scheme of ISO 12233 e-SFR, applied to the line itself);
 * 4. the tilt θ = atan(b·p_across/p_along) is reported as edgeAngleDeg (signed: positive when the across coordinate
 *    grows along the line); when the line drifts by ≥ 1 px across the ROI, the central lines spanning a whole number
 *    of pixel phases are kept (ISO 12233 practice), so that the phases, hence the aliases, average out evenly;
 * 5. LSF: every line (row or column) is shifted so that its fitted centre lands on a common origin and summed. The
 *    shift is exact (sub-pixel) as a phase ramp e^(−2πik·s/N) on each line's FFT (zero-padded to N ≥ 2×length); the
 *    summed spectrum S is the DFT of all pixels placed at their true distances from the line, with no binning blur,
 *    for any tilt including 0°. LSF = inverse FFT of S / number of lines (background-subtracted, tails neither
 *    windowed nor tapered: the whole ROI width is used);
 * 6. MTF = |S| / S(0) = |FFT(LSF)| normalised at 0, at normal frequency k/(N·p_across·cos θ), up to 1/(2p·cos θ);
 *    nyquist = 1/(2p_across); FWHM/FWTM along the normal by measureProfileWidth at pitch p_across·cos θ;
 *    a 1-D Gaussian fit of the LSF as a second estimate (details.gaussianFit).
 */
import { AnalysisError } from "./errors";
import { assertRoiInImage, measureBackground } from "./background";
import { fftPlan, nextPowerOfTwo } from "./fft";
import { fitGaussian1d, type GaussianFit1d } from "./fit-gaussian";
import { summariseMtf } from "./mtf-metrics";
import { assertAnalysableImage } from "./point-source";
import { fwhmAndFwtm } from "./profile-width";
import { ANALYSIS_VERSION, type AnalysisResult, type AnalysisWarning, type GrayImage, type Roi } from "./types";

export interface LineSourceSettings {
  /** Blocks of lines used for the coarse position estimate. */
  coarseBlocks: number;
  /** Centroid window half-width in FWHMs (at least minCentroidHalfWindowPx). */
  centroidHalfWindowPerFwhm: number;
  minCentroidHalfWindowPx: number;
  centroidPasses: number;
  /** The median per-line signal must reach this fraction of the mean of the strongest 10% of lines. */
  minRowSignalFraction: number;
  /** Below this LSF peak / LSF noise SD the image is rejected. */
  minPeakToNoise: number;
  /** Below this LSF peak / LSF noise SD a "low_snr" warning is given. */
  lowSnrPeakToNoise: number;
  /** A FWHM below this many pixels gives an "undersampled" warning. */
  undersampledFwhmPx: number;
  /** Minimum zero-padded FFT length. */
  minFftSize: number;
}

/** Settings of {@link analyseLineSource}. */
export const LINE_SOURCE_DEFAULTS: LineSourceSettings = {
  coarseBlocks: 8,
  centroidHalfWindowPerFwhm: 2,
  minCentroidHalfWindowPx: 3,
  centroidPasses: 3,
  minRowSignalFraction: 0.2,
  minPeakToNoise: 5,
  lowSnrPeakToNoise: 20,
  undersampledFwhmPx: 3,
  minFftSize: 256,
};

/** The ROI seen as lines along the source: value(a, c) at along index a and across index c. */
interface LineView {
  orientation: "vertical" | "horizontal";
  alongCount: number;
  acrossCount: number;
  alongSpacingMm: number;
  acrossSpacingMm: number;
  value: (along: number, across: number) => number;
}

/**
 * Analyses the image of a straight line source (method "line"); see the file header for the procedure.
 *
 * @param image row-major frame in physical units (bright line on a darker, flat background), spacing in mm.
 * @param options.roi optional rectangle (frame pixels) to analyse; default the whole image. The line should cross it
 *   from side to side.
 * @returns AnalysisResult with FWHM/FWTM along the normal (mm), MTF along the normal (cycles/mm), MTF50/MTF10/MTF at
 *   Nyquist, edgeAngleDeg (signed tilt to the nearest axis), spread curve "lsf" (axis "normal", mm from the parabolic
 *   peak, normalised to peak 1) and details { orientation, tiltDeg, lineCentrePx, linesUsed, phaseCycles,
 *   backgroundLevel, noiseSd, peakToNoise, fwhmPx, lsfPitchMm, gaussianFit }.
 *   Warnings: "undersampled" (FWHM < 3 px), "low_snr" (LSF peak/noise < 20), "roi_at_image_border" (line within
 *   3 FWHM of the ROI edge), "gaussian_fit_failed".
 * @throws AnalysisError (code "no_line") when no line crosses the ROI or it does not stand out from the noise;
 *   AnalysisError when the image/ROI is invalid or the LSF does not fall to 10% of its peak inside the ROI.
 */
export function analyseLineSource(image: GrayImage, options: { roi?: Roi } = {}): AnalysisResult {
  const settings = LINE_SOURCE_DEFAULTS;
  assertAnalysableImage(image, 16);
  const roi = options.roi ?? { x: 0, y: 0, width: image.width, height: image.height };
  assertRoiInImage(image, roi);
  if (roi.width < 16 || roi.height < 16) throw new AnalysisError(`line-source ROI must be at least 16×16 px, got ${roi.width}×${roi.height}`);
  const warnings: AnalysisWarning[] = [];

  const view = lineView(image, roi, measureBackground(image, roi).level);
  const vertical = view.orientation === "vertical";
  const background = measureBackground(image, roi, { sides: { top: !vertical, bottom: !vertical, left: vertical, right: vertical } });
  const bg = background.level;
  const { alongCount, acrossCount } = view;

  // Coarse line from block profiles, then per-line centroids and a straight-line fit.
  let line = coarseLine(view, bg, settings);
  const halfWindow = Math.max(settings.minCentroidHalfWindowPx, Math.ceil(settings.centroidHalfWindowPerFwhm * line.fwhmPx));
  const signal = new Float64Array(alongCount);
  for (let pass = 0; pass < settings.centroidPasses; pass++) {
    const along: number[] = [];
    const centre: number[] = [];
    for (let a = 0; a < alongCount; a++) {
      const predicted = line.offset + line.slope * a;
      const c0 = Math.max(0, Math.round(predicted) - halfWindow);
      const c1 = Math.min(acrossCount - 1, Math.round(predicted) + halfWindow);
      let weight = 0;
      let moment = 0;
      for (let c = c0; c <= c1; c++) {
        const w = view.value(a, c) - bg;
        weight += w;
        moment += w * c;
      }
      signal[a] = weight;
      if (weight > 0) {
        along.push(a);
        centre.push(moment / weight);
      }
    }
    if (along.length < alongCount / 2) throw noLine(`a line was found in only ${along.length} of ${alongCount} rows or columns`);
    line = { ...line, ...fitStraightLine(along, centre) };
  }
  assertLinePresentThroughout(signal, settings);

  const tiltRad = Math.atan((line.slope * view.acrossSpacingMm) / view.alongSpacingMm);
  const cosTilt = Math.cos(tiltRad);
  const { first, count: linesUsed, phaseCycles } = wholePhaseCycles(line.slope, alongCount);

  // Phase-aligned sum of the line spectra (see header, step 5).
  const n = nextPowerOfTwo(Math.max(2 * acrossCount, settings.minFftSize));
  const plan = fftPlan(n);
  const input = new Float64Array(n);
  const output = new Float64Array(2 * n);
  const sum = new Float64Array(2 * n);
  const rampRe = new Float64Array(n / 2 + 1);
  const rampIm = new Float64Array(n / 2 + 1);
  let minCentre = Infinity;
  let maxCentre = -Infinity;
  for (let a = first; a < first + linesUsed; a++) {
    for (let c = 0; c < acrossCount; c++) input[c] = view.value(a, c) - bg;
    // Real input: fft.js fills bins 0 … n/2 only, which is all the sum needs (see below).
    plan.realTransform(output, input);
    const centre = line.offset + line.slope * a;
    minCentre = Math.min(minCentre, centre);
    maxCentre = Math.max(maxCentre, centre);
    const shift = n / 2 - centre;
    phaseRamp(shift, n, rampRe, rampIm);
    for (let k = 0; k < n / 2; k++) {
      const re = output[2 * k]!;
      const im = output[2 * k + 1]!;
      sum[2 * k] += re * rampRe[k]! - im * rampIm[k]!;
      sum[2 * k + 1] += re * rampIm[k]! + im * rampRe[k]!;
    }
    sum[n] += output[n]! * rampRe[n / 2]!; // Nyquist bin: keep the shifted signal real (cos of the phase only)
  }
  // The shifted lines are real, so the negative frequencies k − n are the conjugates of n − k.
  for (let k = n / 2 + 1; k < n; k++) {
    sum[2 * k] = sum[2 * (n - k)]!;
    sum[2 * k + 1] = -sum[2 * (n - k) + 1]!;
  }
  const dc = sum[0]!;
  if (!(dc > 0)) throw noLine(`the background-subtracted line integral is ${dc.toFixed(3)}, not positive`);
  const pitchMm = view.acrossSpacingMm * cosTilt;
  const frequencyCyclesPerMm: number[] = [];
  const mtfValue: number[] = [];
  for (let k = 0; k <= n / 2; k++) {
    frequencyCyclesPerMm.push(k / (n * pitchMm));
    mtfValue.push(Math.hypot(sum[2 * k]!, sum[2 * k + 1]!) / dc);
  }
  const mtf = { frequencyCyclesPerMm, value: mtfValue };

  const inverse = new Float64Array(2 * n);
  plan.inverseTransform(inverse, sum);
  // Samples every line covers: across positions n/2 − min(c) … n/2 − max(c) + acrossCount − 1.
  const lsfStart = Math.ceil(n / 2 - minCentre);
  const lsfEnd = Math.floor(n / 2 - maxCentre + acrossCount - 1);
  const lsf = new Float64Array(lsfEnd - lsfStart + 1);
  for (let i = 0; i < lsf.length; i++) lsf[i] = inverse[2 * (lsfStart + i)]! / linesUsed;

  const widths = fwhmAndFwtm(lsf, pitchMm);
  const fwhmPx = widths.fwhm.widthMm / pitchMm;
  const lsfNoiseSd = background.noiseSd / Math.sqrt(linesUsed);
  const peakToNoise = lsfNoiseSd > 0 ? widths.fwhm.peakValue / lsfNoiseSd : Infinity;
  if (peakToNoise < settings.minPeakToNoise) {
    throw noLine(`the LSF peak is ${peakToNoise.toFixed(1)} noise SDs above the background, need at least ${settings.minPeakToNoise}`);
  }
  addWarnings(warnings, { fwhmPx, peakToNoise, minCentre, maxCentre, acrossCount, settings });
  const gaussianFit = fitLsf(lsf, pitchMm, warnings);
  const nyquist = 1 / (2 * view.acrossSpacingMm);
  const summary = summariseMtf(mtf, nyquist);
  const tiltDeg = (tiltRad * 180) / Math.PI;
  const peakPosition = widths.fwhm.peakPositionPx;

  return {
    method: "line",
    version: ANALYSIS_VERSION,
    pixelSpacingMm: image.pixelSpacingMm,
    fwhmMm: widths.fwhm.widthMm,
    fwtmMm: widths.fwtm.widthMm,
    mtf50: summary.mtf50,
    mtf10: summary.mtf10,
    nyquist,
    mtfAtNyquist: summary.mtfAtNyquist,
    edgeAngleDeg: tiltDeg,
    mtf,
    spread: [
      {
        id: "lsf",
        kind: "lsf",
        axis: "normal",
        positionMm: Array.from(lsf, (_, i) => (i - peakPosition) * pitchMm),
        value: Array.from(lsf, (v) => v / widths.fwhm.peakValue),
      },
    ],
    roi,
    warnings,
    details: {
      orientation: view.orientation,
      tiltDeg,
      lineCentrePx: vertical
        ? { x: roi.x + line.offset + (line.slope * (alongCount - 1)) / 2, y: roi.y + (alongCount - 1) / 2 }
        : { x: roi.x + (alongCount - 1) / 2, y: roi.y + line.offset + (line.slope * (alongCount - 1)) / 2 },
      linesUsed,
      phaseCycles,
      backgroundLevel: bg,
      noiseSd: background.noiseSd,
      peakToNoise: Number.isFinite(peakToNoise) ? peakToNoise : null,
      fwhmPx,
      lsfPitchMm: pitchMm,
      gaussianFit,
    },
  };
}

/**
 * Phase factors e^(−2πik·shift/n) for k = 0 … n/2 into (re, im), by complex rotation (recurrence) re-anchored with
 * exact cos/sin every 64 steps to keep rounding below 1e-14.
 */
function phaseRamp(shift: number, n: number, re: Float64Array, im: Float64Array): void {
  const angle = (-2 * Math.PI * shift) / n;
  const stepRe = Math.cos(angle);
  const stepIm = Math.sin(angle);
  for (let k = 0; k <= n / 2; k++) {
    if (k % 64 === 0) {
      re[k] = Math.cos(angle * k);
      im[k] = Math.sin(angle * k);
    } else {
      re[k] = re[k - 1]! * stepRe - im[k - 1]! * stepIm;
      im[k] = re[k - 1]! * stepIm + im[k - 1]! * stepRe;
    }
  }
}

function noLine(reason: string): AnalysisError {
  return new AnalysisError(
    `no line source found: ${reason}; check that the line crosses the ROI from side to side (for a point source use the point method)`,
    "no_line",
  );
}

/** Chooses the orientation whose projection is more peaked (max − median of the means along each axis). */
function lineView(image: GrayImage, roi: Roi, background: number): LineView {
  const columnMeans = new Float64Array(roi.width);
  const rowMeans = new Float64Array(roi.height);
  for (let row = 0; row < roi.height; row++) {
    const offset = (roi.y + row) * image.width + roi.x;
    for (let col = 0; col < roi.width; col++) {
      const v = image.data[offset + col]! - background;
      columnMeans[col] += v / roi.height;
      rowMeans[row] += v / roi.width;
    }
  }
  const vertical = peakedness(columnMeans) >= peakedness(rowMeans);
  const { x: px, y: py } = image.pixelSpacingMm;
  return vertical
    ? { orientation: "vertical", alongCount: roi.height, acrossCount: roi.width, alongSpacingMm: py, acrossSpacingMm: px,
        value: (a, c) => image.data[(roi.y + a) * image.width + roi.x + c]! }
    : { orientation: "horizontal", alongCount: roi.width, acrossCount: roi.height, alongSpacingMm: px, acrossSpacingMm: py,
        value: (a, c) => image.data[(roi.y + c) * image.width + roi.x + a]! };
}

function peakedness(profile: Float64Array): number {
  const sorted = Float64Array.from(profile).sort();
  return sorted[sorted.length - 1]! - sorted[sorted.length >> 1]!;
}

/** Coarse line: thresholded centroid (above half maximum) of each block's mean profile, then a straight-line fit. */
function coarseLine(view: LineView, bg: number, settings: LineSourceSettings) {
  const blocks = Math.min(settings.coarseBlocks, Math.floor(view.alongCount / 4));
  const along: number[] = [];
  const centre: number[] = [];
  const widths: number[] = [];
  const profile = new Float64Array(view.acrossCount);
  for (let b = 0; b < blocks; b++) {
    const a0 = Math.floor((b * view.alongCount) / blocks);
    const a1 = Math.floor(((b + 1) * view.alongCount) / blocks);
    profile.fill(0);
    for (let a = a0; a < a1; a++) for (let c = 0; c < view.acrossCount; c++) profile[c] += (view.value(a, c) - bg) / (a1 - a0);
    let peak = 0;
    for (let c = 1; c < view.acrossCount; c++) if (profile[c]! > profile[peak]!) peak = c;
    const half = profile[peak]! / 2;
    if (!(half > 0)) continue;
    let lo = peak;
    while (lo > 0 && profile[lo - 1]! > half) lo--;
    let hi = peak;
    while (hi < view.acrossCount - 1 && profile[hi + 1]! > half) hi++;
    let weight = 0;
    let moment = 0;
    for (let c = lo; c <= hi; c++) {
      weight += profile[c]! - half;
      moment += (profile[c]! - half) * c;
    }
    along.push((a0 + a1 - 1) / 2);
    centre.push(weight > 0 ? moment / weight : peak);
    widths.push(hi - lo + 1);
  }
  if (along.length < 2) throw noLine("no block of rows or columns rises above the background");
  widths.sort((p, q) => p - q);
  return { ...fitStraightLine(along, centre), fwhmPx: widths[widths.length >> 1]! };
}

/** Least-squares line centre = offset + slope·along. */
function fitStraightLine(along: number[], centre: number[]): { offset: number; slope: number } {
  const n = along.length;
  let meanA = 0;
  let meanC = 0;
  for (let i = 0; i < n; i++) {
    meanA += along[i]! / n;
    meanC += centre[i]! / n;
  }
  let saa = 0;
  let sac = 0;
  for (let i = 0; i < n; i++) {
    saa += (along[i]! - meanA) ** 2;
    sac += (along[i]! - meanA) * (centre[i]! - meanC);
  }
  const slope = saa > 0 ? sac / saa : 0;
  return { offset: meanC - slope * meanA, slope };
}

/** Throws unless the line carries signal in most rows: median signal ≥ fraction × mean of the strongest 10%. */
function assertLinePresentThroughout(signal: Float64Array, settings: LineSourceSettings): void {
  const sorted = Float64Array.from(signal).sort();
  const top = Math.max(1, Math.floor(sorted.length / 10));
  let topMean = 0;
  for (let i = sorted.length - top; i < sorted.length; i++) topMean += sorted[i]! / top;
  const median = sorted[sorted.length >> 1]!;
  if (!(topMean > 0) || median < settings.minRowSignalFraction * topMean) {
    const percent = topMean > 0 ? Math.round((100 * median) / topMean) : 0;
    throw noLine(`the median line signal is ${percent}% of the strongest lines', need ≥ ${Math.round(100 * settings.minRowSignalFraction)}%`);
  }
}

/** Central run of lines over which the line drifts by a whole number of pixels (all of them when it drifts < 1 px). */
function wholePhaseCycles(slope: number, alongCount: number): { first: number; count: number; phaseCycles: number } {
  const drift = Math.abs(slope) * alongCount;
  if (drift < 1) return { first: 0, count: alongCount, phaseCycles: drift };
  const cycles = Math.floor(drift);
  const count = Math.min(alongCount, Math.round(cycles / Math.abs(slope)));
  return { first: Math.floor((alongCount - count) / 2), count, phaseCycles: cycles };
}

function addWarnings(
  warnings: AnalysisWarning[],
  m: { fwhmPx: number; peakToNoise: number; minCentre: number; maxCentre: number; acrossCount: number; settings: LineSourceSettings },
): void {
  if (m.fwhmPx < m.settings.undersampledFwhmPx) {
    warnings.push({
      code: "undersampled",
      message: `FWHM is ${m.fwhmPx.toFixed(2)} px, below ${m.settings.undersampledFwhmPx} px; use smaller pixels or tilt the line a few degrees`,
    });
  }
  if (m.peakToNoise < m.settings.lowSnrPeakToNoise) {
    warnings.push({
      code: "low_snr",
      message: `LSF peak is ${m.peakToNoise.toFixed(1)} noise SDs above the background, below ${m.settings.lowSnrPeakToNoise}; acquire more counts`,
    });
  }
  const margin = Math.min(m.minCentre, m.acrossCount - 1 - m.maxCentre);
  if (margin < 3 * m.fwhmPx) {
    warnings.push({
      code: "roi_at_image_border",
      message: `the line comes within ${margin.toFixed(1)} px of the ROI edge (less than 3 FWHM); the LSF tails are truncated`,
    });
  }
}

function fitLsf(lsf: Float64Array, pitchMm: number, warnings: AnalysisWarning[]): GaussianFit1d | null {
  try {
    return fitGaussian1d(lsf, pitchMm);
  } catch (error) {
    if (!(error instanceof AnalysisError)) throw error;
    warnings.push({ code: "gaussian_fit_failed", message: `1-D Gaussian fit of the LSF failed: ${error.message}` });
    return null;
  }
}
