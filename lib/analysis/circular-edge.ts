/**
 * MTF (task transfer function, TTF) by the circular-edge method for CT inserts: Richard, Husarik, Yadava, Murphy &
 * Samei, Med Phys 2012;39:4115; AAPM TG-233 (Samei et al., Med Phys 2019;46:e735).
 * 1. find the insert: the most conspicuous object in the ROI must be closed, round, large enough and flat inside
 *    (object-region.ts); both brighter and darker inserts;
 * 2. sub-pixel centre and radius: edge points on rays + algebraic circle fit (disk-locate.ts);
 * 3. radial ESF: every pixel in the annulus R − wᵢₙ … R + wₒᵤₜ is binned by its distance to the centre minus R, bins
 *    of p/binsPerPixel (p = the coarser pixel pitch); wᵢₙ ≤ 0.75 R so bins stay well filled near the centre;
 * 4. radius refined to the ESF's 50 % crossing; LSF, Tukey window (the radial range of small inserts is short, see
 *    edge-spread-filters.ts), |FFT|, MTF(0) = 1, capped derivative and bin-averaging corrections (edge-spread.ts).
 * The radial axis points outwards; positions are relative to the refined radius.
 */
import { assertRoiInImage } from "./background";
import { locateDisk } from "./disk-locate";
import { EDGE_SPREAD_DEFAULTS, EsfAccumulator, meanOver, type BinnedEsf } from "./edge-spread";
import { AnalysisError } from "./errors";
import { summariseEsf } from "./esf-summary";
import { findObjectRegion, type ObjectRegion } from "./object-region";
import { binAnnulus, plateauNoiseSd, type Annulus } from "./radial-esf";
import { ANALYSIS_VERSION, type AnalysisResult, type AnalysisWarning, type GrayImage, type Roi } from "./types";

/** Defaults of {@link analyseCircularEdge}. */
export const CIRCULAR_EDGE_DEFAULTS = {
  binsPerPixel: 4,
  /** Largest radial range each side of the rim, pixels. */
  maxHalfWidthPx: 32,
  /** The range inside the rim is at most this fraction of the radius. */
  innerFraction: 0.75,
  /** Disk acceptance: radius ≥ minRadiusPx, axis ratio ≤ maxAxisRatio, flatness ≥ minFlatness (object-region.ts). */
  minRadiusPx: 4,
  maxAxisRatio: 1.3,
  minFlatness: 0.8,
  /** Minimum radial range outside the rim, pixels. */
  minOutsidePx: 6,
  /**
   * Tukey taper fraction of the LSF window. A quarter keeps the window flat over ±0.75 of the short radial range of
   * small inserts (with 0.5 the MTF error of a 5-px-radius insert rose from 0.014 to 0.035 in Halfmax's tests).
   */
  tukeyTaper: 0.25,
  /** "low_snr" when the estimated MTF noise SD at Nyquist exceeds this. */
  maxMtfNoiseAtNyquist: 0.02,
  /** "small_insert" when the radius is below this multiple of the LSF FWHM (curvature bias grows as (σ/R)²). */
  minRadiusPerFwhm: 4,
  maxFrequencyPerNyquist: 2,
  /** "empty_bins" warning when more than this fraction of the ESF bins had no samples (they are interpolated). */
  maxEmptyBinFraction: 0.05,
} as const;

export interface CircularEdgeOptions {
  /** Region containing one insert with a margin of background; default the whole image. */
  roi?: Roi;
  /**
   * The object region already found by findObjectRegion(image, roi) (e.g. during the automatic method choice); the
   * search is then skipped. Its roi must equal the ROI analysed.
   */
  region?: ObjectRegion;
}

/**
 * Circular-edge MTF of a disk insert (see file header).
 * @param image row-major frame, values linear (e.g. HU), insert brighter or darker than its surroundings.
 * @param options ROI and, optionally, the object region already found in it (see {@link CircularEdgeOptions}).
 * @returns method "disk": radial MTF (0 … 2 × Nyquist, cycles/mm, 1 at 0) with nyquist = 1/(2p) for the coarser pitch
 *   p, MTF50/MTF10/MTF(Nyquist), FWHM/FWTM of the radial LSF (mm), spread curves "esf" (pixel values) and "lsf" (unit
 *   area, 1/mm) on the "radial" axis, details (centre in pixels, radius in mm, inside/outside values, contrast…).
 * @throws AnalysisError when the ROI is invalid, a region found in another ROI is passed in, or no disk is found
 *   (nothing stands out, the object reaches the ROI border, is elongated, smaller than minRadiusPx or not flat
 *   inside), or the rim is too close to the ROI border.
 */
export function analyseCircularEdge(image: GrayImage, options: CircularEdgeOptions = {}): AnalysisResult {
  const o = CIRCULAR_EDGE_DEFAULTS;
  const roi = options.roi ?? { x: 0, y: 0, width: image.width, height: image.height };
  assertRoiInImage(image, roi);
  const region = options.region ?? findDiskRegion(image, roi);
  if (!sameRoi(region.roi, roi)) throw new AnalysisError("the object region passed in was found in another ROI than the one analysed");
  const reject = (why: string): never => {
    throw new AnalysisError(`no disk found: ${why}`, "no_disk");
  };
  if (region.touchesRoiBorder) reject("the object reaches the ROI border, so it is not a closed disk; choose an ROI around one insert with a margin");
  if (region.axisRatio > o.maxAxisRatio) reject(`the object is elongated (axis ratio ${region.axisRatio.toFixed(2)}, at most ${o.maxAxisRatio})`);
  if (region.equalAreaRadiusPx < o.minRadiusPx) reject(`the object's radius ${region.equalAreaRadiusPx.toFixed(1)} px is below ${o.minRadiusPx} px`);
  if (!(region.flatness >= o.minFlatness)) reject(`the object has no flat interior (flatness ${region.flatness.toFixed(2)}, at least ${o.minFlatness}); a point source?`);

  const disk = locateDisk(image, region);
  const { x: px, y: py } = image.pixelSpacingMm;
  const pitch = Math.max(px, py);
  const { centreXMm: cx, centreYMm: cy, radiusMm: radius } = disk;
  const roomMm = Math.min(cx - roi.x * px, (roi.x + roi.width - 1) * px - cx, cy - roi.y * py, (roi.y + roi.height - 1) * py - cy) - radius;
  const outerMm = Math.min(o.maxHalfWidthPx * pitch, roomMm);
  const innerMm = Math.min(o.maxHalfWidthPx * pitch, o.innerFraction * radius);
  if (outerMm < o.minOutsidePx * pitch) {
    throw new AnalysisError(`the disk rim lies ${(roomMm / pitch).toFixed(1)} px from the ROI border; at least ${o.minOutsidePx} px of background needed`);
  }

  const binWidthMm = pitch / o.binsPerPixel;
  const accumulator = new EsfAccumulator(-innerMm, outerMm, binWidthMm);
  const reach = radius + outerMm;
  const annulus: Annulus = {
    centreXMm: cx,
    centreYMm: cy,
    radiusMm: radius,
    innerMm,
    outerMm,
    x0: Math.max(roi.x, Math.ceil((cx - reach) / px)),
    x1: Math.min(roi.x + roi.width - 1, Math.floor((cx + reach) / px)),
    y0: Math.max(roi.y, Math.ceil((cy - reach) / py)),
    y1: Math.min(roi.y + roi.height - 1, Math.floor((cy + reach) / py)),
  };
  const { x0, x1, y0, y1 } = annulus;
  const pixelsUsed = binAnnulus(image, annulus, accumulator);
  const esf = accumulator.finish();
  const edgeBins = Math.max(2, Math.round(0.1 * esf.value.length));
  const insideValue = meanOver(esf.value, 0, edgeBins);
  const outsideValue = meanOver(esf.value, esf.value.length - edgeBins, esf.value.length);
  const contrast = insideValue - outsideValue;
  const rimOffsetMm = halfLevelCrossing(esf, 0.5 * (insideValue + outsideValue));
  const plateauNoise = plateauNoiseSd(image, annulus, accumulator, rimOffsetMm, 0.5 * Math.min(innerMm, outerMm));
  const noiseSd = Number.isNaN(plateauNoise) ? region.noiseSd : plateauNoise;

  const nyquist = 1 / (2 * pitch);
  const { chain, widths, summary, mtfNoiseAtNyquist } = summariseEsf(
    esf,
    { window: "tukey", tukeyTaper: o.tukeyTaper, centreMm: rimOffsetMm, maxFrequencyCyclesPerMm: o.maxFrequencyPerNyquist * nyquist },
    { nyquistCyclesPerMm: nyquist, binWidthMm, pixelNoiseSd: noiseSd, contrast, pixelsUsed },
  );
  const finalRadius = radius + rimOffsetMm;
  const cnr = noiseSd > 0 ? Math.abs(contrast) / noiseSd : Infinity;

  const warnings: AnalysisWarning[] = [...widths.warnings];
  if (mtfNoiseAtNyquist > o.maxMtfNoiseAtNyquist) {
    warnings.push({
      code: "low_snr",
      message: `contrast-to-noise ratio ${cnr.toFixed(1)}: the MTF at Nyquist carries about ±${mtfNoiseAtNyquist.toFixed(3)} of noise (more than ${o.maxMtfNoiseAtNyquist}); average repeated scans (AAPM TG-233) or use a higher-contrast insert`,
    });
  }
  if (x0 === 0 || y0 === 0 || x1 === image.width - 1 || y1 === image.height - 1) {
    warnings.push({ code: "roi_at_image_border", message: "the analysed annulus reaches the image border" });
  }
  if (widths.fwhmMm !== null && finalRadius < o.minRadiusPerFwhm * widths.fwhmMm) {
    warnings.push({
      code: "small_insert",
      message: `the disk radius ${finalRadius.toFixed(2)} mm is only ${(finalRadius / widths.fwhmMm).toFixed(1)}× the LSF FWHM; curvature biases the radial ESF (≥ ${o.minRadiusPerFwhm}× recommended)`,
    });
  }
  if (esf.emptyBins > o.maxEmptyBinFraction * esf.value.length) {
    warnings.push({ code: "empty_bins", message: `${esf.emptyBins} of ${esf.value.length} ESF bins were empty and interpolated` });
  }

  const roiUsed: Roi = { x: x0, y: y0, width: x1 - x0 + 1, height: y1 - y0 + 1 };
  return {
    method: "disk",
    version: ANALYSIS_VERSION,
    pixelSpacingMm: image.pixelSpacingMm,
    fwhmMm: widths.fwhmMm,
    fwtmMm: widths.fwtmMm,
    mtf50: summary.mtf50,
    mtf10: summary.mtf10,
    nyquist,
    mtfAtNyquist: summary.mtfAtNyquist,
    mtf: chain.mtf,
    spread: [
      {
        id: "esf",
        kind: "esf",
        axis: "radial",
        positionMm: Array.from(esf.value, (_, i) => (esf.firstBin + i) * binWidthMm - rimOffsetMm),
        value: Array.from(esf.value),
      },
      { id: "lsf", kind: "lsf", axis: "radial", positionMm: Array.from(chain.lsfPositionMm, (p) => p - rimOffsetMm), value: Array.from(chain.lsf) },
    ],
    roi: roiUsed,
    warnings,
    details: {
      centreXPx: cx / px,
      centreYPx: cy / py,
      radiusMm: finalRadius,
      radiusPx: finalRadius / pitch,
      insideValue,
      outsideValue,
      contrast,
      polarity: contrast >= 0 ? "brighter" : "darker",
      noiseSd,
      contrastToNoise: Number.isFinite(cnr) ? cnr : null,
      mtfNoiseAtNyquist,
      pixelsUsed,
      esfRangeMm: [-innerMm, outerMm],
      binWidthMm,
      emptyBins: esf.emptyBins,
      circleFitRmsMm: disk.fitRmsMm,
      edgePoints: disk.edgePoints,
      rays: disk.rays,
      derivative: EDGE_SPREAD_DEFAULTS.derivative,
      window: "tukey",
      fftLength: chain.fftLength,
    },
  };
}

function findDiskRegion(image: GrayImage, roi: Roi): ObjectRegion {
  try {
    return findObjectRegion(image, roi);
  } catch (error) {
    if (error instanceof AnalysisError) throw new AnalysisError(`no disk found: ${error.message}`, "no_disk");
    throw error;
  }
}

function sameRoi(a: Roi, b: Roi): boolean {
  return a.x === b.x && a.y === b.y && a.width === b.width && a.height === b.height;
}

/** Position (mm) where the ESF crosses `level`, nearest to 0, interpolated linearly; 0 when it never does. */
function halfLevelCrossing(esf: BinnedEsf, level: number): number {
  let best = 0;
  let bestDistance = Infinity;
  for (let i = 0; i < esf.value.length - 1; i++) {
    const a = esf.value[i]! - level;
    const b = esf.value[i + 1]! - level;
    if ((a > 0 && b <= 0) || (a < 0 && b >= 0)) {
      const position = (esf.firstBin + i + a / (a - b)) * esf.binWidthMm;
      if (Math.abs(position) < bestDistance) {
        bestDistance = Math.abs(position);
        best = position;
      }
    }
  }
  return best;
}
