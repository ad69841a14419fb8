/**
 * Presampled MTF by the slanted-edge method (IEC 62220-1-1:2015; Buhr, Günther-Kohfahl & Neitzel, Med Phys 2003,
 * doi 10.1118/1.1598673; steps of ISO 12233 e-SFR, from memory):
 * 1. orientation and working frame (edge-frame.ts); default ROI: the central {@link SLANTED_EDGE_DEFAULTS}.autoRoiRows
 *    rows along the edge and, across it, ±(halfWidthPx/cos 20° + the edge's drift over half the band + 16) px around
 *    the steepest step of the band's mean profile (≤ 256 × 263 px whatever the image size);
 * 2. edge line: block 50 % crossings, then two passes of Hamming-windowed derivative centroids per row and a
 *    least-squares line fit (edge-locate.ts) → edge angle; angles outside [minAngleDeg, maxAngleDeg] are rejected;
 * 3. rows trimmed to a whole number of phase cycles (1/tan α rows each), so the sub-pixel phases fill the bins evenly;
 * 4. every pixel within ±halfWidthPx (along the normal) of the edge is projected onto the edge normal and averaged into
 *    bins of p/binsPerPixel (p = pixel pitch across the edge) → oversampled ESF (edge-projection.ts);
 * 5. two-tap derivative (ISO 12233) → LSF, Hamming window, |FFT|, MTF(0) = 1, capped derivative correction and
 *    bin-averaging correction (edge-spread.ts).
 * The normal axis points towards increasing column (vertical edge) or row (horizontal edge) index.
 */
import { assertRoiInImage } from "./background";
import { extractEdgeFrame, frameRegionToRoi } from "./edge-frame";
import { locateEdgeCoarse, refineEdgeLine, type EdgeLine } from "./edge-locate";
import { projectEdge } from "./edge-projection";
import { EDGE_SPREAD_DEFAULTS, meanOver } from "./edge-spread";
import { summariseEsf } from "./esf-summary";
import { AnalysisError } from "./errors";
import { ANALYSIS_VERSION, type AnalysisResult, type AnalysisWarning, type GrayImage, type Roi } from "./types";

/** Defaults of {@link analyseSlantedEdge}. */
export const SLANTED_EDGE_DEFAULTS = {
  /** ESF oversampling: bins per pixel pitch across the edge (ISO 12233 and IEC 62220-1-1 use 4). */
  binsPerPixel: 4,
  /** ESF range each side of the edge along the normal, pixels (the LSF window spans the same range). */
  halfWidthPx: 64,
  /** Rows along the edge in the automatic ROI. */
  autoRoiRows: 256,
  /**
   * Accepted edge angles to the nearest image axis, degrees. Below 1° a 256-row ROI spans < 4.5 phase cycles and the
   * edge location per row is nearly constant, so the angle (and the sub-pixel phases) become unreliable; at 0° the
   * phases do not fill the bins at all. Above 20° the pixel aperture projected on the normal departs from the pixel
   * pitch (trapezoid of widths p·cos α and p·sin α) and the row-wise location assumes an edge nearer to the columns.
   */
  minAngleDeg: 1,
  maxAngleDeg: 20,
  /** Warning outside this range (ISO 12233 suggests about 5°; 2°–10° works well). */
  comfortMinAngleDeg: 2,
  comfortMaxAngleDeg: 10,
  minAcrossPx: 32,
  minAlongPx: 16,
  /** Minimum plateau each side of the edge, pixels along the normal. */
  minSidePx: 8,
  /** Rejected below this contrast-to-noise ratio (plateau difference / pixel noise SD). */
  minCnr: 3,
  /** "low_snr" warning when the estimated MTF noise SD at Nyquist (edge-spread.ts mtfNoiseSd) exceeds this. */
  maxMtfNoiseAtNyquist: 0.02,
  /** Derivative-centroid passes (ISO 12233 re-centres once). */
  refinePasses: 2,
  /** The MTF is reported up to this multiple of the Nyquist frequency. */
  maxFrequencyPerNyquist: 2,
  /** "empty_bins" warning when more than this fraction of the ESF bins had no samples (they are interpolated). */
  maxEmptyBinFraction: 0.05,
} as const;

export interface SlantedEdgeOptions {
  /** Region containing one straight edge; default: automatic band around the image centre. */
  roi?: Roi;
}

/**
 * Slanted-edge presampled MTF of a straight edge (see file header for the method).
 * @param image row-major frame, values linear in exposure (apply the conversion function first), any polarity.
 * @returns method "edge": mtf along the edge normal (0 … 2 × Nyquist, cycles/mm, 1 at 0), nyquist = 1/(2p) for the
 *   pitch p across the edge, MTF50/MTF10/MTF(Nyquist), edgeAngleDeg (unsigned, to the nearest axis), FWHM/FWTM of the
 *   LSF (mm), spread curves "esf" (pixel values) and "lsf" (unit area, 1/mm) on the "normal" axis, and details.
 * @throws AnalysisError for an ROI outside the image or too small, no edge (uniform or CNR < minCnr), an edge too close
 *   to the ROI side, or an edge angle outside [minAngleDeg, maxAngleDeg] (the message gives the measured angle).
 */
export function analyseSlantedEdge(image: GrayImage, options: SlantedEdgeOptions = {}): AnalysisResult {
  const o = SLANTED_EDGE_DEFAULTS;
  const region = options.roi ?? { x: 0, y: 0, width: image.width, height: image.height };
  assertRoiInImage(image, region);
  const maxTilt = Math.tan((o.maxAngleDeg * Math.PI) / 180);
  const frame = extractEdgeFrame(image, region, {
    bandRows: options.roi ? undefined : o.autoRoiRows,
    // The ±halfWidthPx normal range at the steepest tilt, the edge's drift over half the band, and a margin.
    bandHalfCols: options.roi ? undefined : Math.ceil(o.halfWidthPx * Math.sqrt(1 + maxTilt * maxTilt) + (o.autoRoiRows / 2) * maxTilt) + 16,
    minAcrossPx: o.minAcrossPx,
    minAlongPx: o.minAlongPx,
  });
  const pu = frame.acrossPitchMm;
  const axisName = frame.orientation === "vertical" ? "column" : "row";

  const coarse = locateEdgeCoarse(frame, o.minCnr);
  const checkAngle = (line: EdgeLine, margin: number): number => {
    const angle = (Math.atan((line.slope * pu) / frame.alongPitchMm) * 180) / Math.PI;
    const size = Math.abs(angle);
    if (size > o.maxAngleDeg + margin) {
      throw new AnalysisError(
        `edge angle ${size.toFixed(2)}° to the ${axisName} axis exceeds ${o.maxAngleDeg}°; tilt the edge to 2°–10° from the pixel ${axisName}s`,
        "edge_angle",
      );
    }
    if (size < o.minAngleDeg - margin) {
      throw new AnalysisError(
        `edge angle ${size.toFixed(2)}° to the ${axisName} axis is below ${o.minAngleDeg}°: too few sub-pixel phases to oversample the ESF; tilt the edge to 2°–10°`,
        "edge_angle",
      );
    }
    return angle;
  };
  checkAngle(coarse.line, 5); // clear message before the fine stage for grossly wrong angles
  const halfWindowPx = Math.min(o.halfWidthPx, Math.max(6, Math.ceil(2 * coarse.riseWidthPx + 3)));
  let line = coarse.line;
  for (let pass = 0; pass < o.refinePasses; pass++) line = refineEdgeLine(frame, line, coarse.polarity, halfWindowPx);
  const signedAngleDeg = checkAngle(line, 0);
  const angleRad = (Math.abs(signedAngleDeg) * Math.PI) / 180;
  const cos = Math.cos(angleRad);

  // Whole phase cycles: the edge moves |slope| px per row, one cycle every 1/|slope| rows.
  const slope = Math.abs(line.slope);
  const cycles = Math.floor(frame.rows * slope);
  const rowsUsed = cycles >= 1 ? Math.min(frame.rows, Math.round(cycles / slope)) : frame.rows;
  const v0 = Math.floor((frame.rows - rowsUsed) / 2);
  const v1 = v0 + rowsUsed - 1;
  const edgeAt = (v: number): number => line.intercept + line.slope * v;
  const uLow = Math.min(edgeAt(v0), edgeAt(v1));
  const uHigh = Math.max(edgeAt(v0), edgeAt(v1));
  const leftPx = Math.min(o.halfWidthPx, uLow * cos);
  const rightPx = Math.min(o.halfWidthPx, (frame.cols - 1 - uHigh) * cos);
  if (Math.min(leftPx, rightPx) < o.minSidePx) {
    throw new AnalysisError(
      `the edge lies ${Math.min(leftPx, rightPx).toFixed(1)} px from the ROI side; at least ${o.minSidePx} px of plateau needed on each side`,
    );
  }

  const binWidthMm = pu / o.binsPerPixel;
  const projection = projectEdge(frame, line, { v0, v1, leftPx, rightPx, cos, binWidthMm });
  const { esf, pixelsUsed, uMin: uMinUsed, uMax: uMaxUsed } = projection;
  const noiseSd = projection.plateauNoiseSd ?? coarse.noiseSd;

  const edgeBins = Math.max(2, Math.round(0.1 * esf.value.length));
  const lowSide = meanOver(esf.value, 0, edgeBins);
  const highSide = meanOver(esf.value, esf.value.length - edgeBins, esf.value.length);
  const contrast = highSide - lowSide;
  const cnr = noiseSd > 0 ? Math.abs(contrast) / noiseSd : Infinity;

  const nyquist = 1 / (2 * pu);
  const { chain, widths, summary, mtfNoiseAtNyquist } = summariseEsf(
    esf,
    { maxFrequencyCyclesPerMm: o.maxFrequencyPerNyquist * nyquist },
    { nyquistCyclesPerMm: nyquist, binWidthMm, pixelNoiseSd: noiseSd, contrast, pixelsUsed },
  );

  const warnings: AnalysisWarning[] = [...widths.warnings];
  const angle = Math.abs(signedAngleDeg);
  if (angle < o.comfortMinAngleDeg || angle > o.comfortMaxAngleDeg) {
    warnings.push({
      code: "edge_angle",
      message: `edge angle ${angle.toFixed(2)}° is outside ${o.comfortMinAngleDeg}°–${o.comfortMaxAngleDeg}°, where the oversampled ESF is most reliable (about 5° is ideal)`,
    });
  }
  if (cycles < 1) {
    warnings.push({
      code: "too_few_rows",
      message: `${frame.rows} rows span ${(frame.rows * slope).toFixed(2)} phase cycles of the ${angle.toFixed(2)}° edge; at least ${Math.ceil(1 / slope)} rows (one cycle) are needed to fill the ${o.binsPerPixel}× oversampled bins`,
    });
  }
  if (mtfNoiseAtNyquist > o.maxMtfNoiseAtNyquist) {
    warnings.push({
      code: "low_snr",
      message: `contrast-to-noise ratio ${cnr.toFixed(1)}: the MTF at Nyquist carries about ±${mtfNoiseAtNyquist.toFixed(3)} of noise (more than ${o.maxMtfNoiseAtNyquist}); use more rows, a higher dose or averaged images`,
    });
  }
  if (frame.acrossOrigin + uMinUsed === 0 || frame.acrossOrigin + uMaxUsed === frame.imageAcross - 1) {
    warnings.push({ code: "roi_at_image_border", message: "the analysed region reaches the image border across the edge, where detector pixels are often unreliable" });
  }
  if (Math.min(leftPx, rightPx) < o.halfWidthPx) {
    warnings.push({
      code: "esf_range",
      message: `the ESF spans −${leftPx.toFixed(1)} … +${rightPx.toFixed(1)} px across the edge (±${o.halfWidthPx} px by default); the low-frequency MTF is less reliable`,
    });
  }
  if (esf.emptyBins > o.maxEmptyBinFraction * esf.value.length) {
    warnings.push({ code: "empty_bins", message: `${esf.emptyBins} of ${esf.value.length} ESF bins were empty and interpolated` });
  }

  const centreAlong = (frame.imageAlong - 1) / 2 - frame.alongOrigin;
  const esfPositions = Array.from(esf.value, (_, i) => (esf.firstBin + i) * binWidthMm);
  return {
    method: "edge",
    version: ANALYSIS_VERSION,
    pixelSpacingMm: image.pixelSpacingMm,
    fwhmMm: widths.fwhmMm,
    fwtmMm: widths.fwtmMm,
    mtf50: summary.mtf50,
    mtf10: summary.mtf10,
    nyquist,
    mtfAtNyquist: summary.mtfAtNyquist,
    edgeAngleDeg: angle,
    mtf: chain.mtf,
    spread: [
      { id: "esf", kind: "esf", axis: "normal", positionMm: esfPositions, value: Array.from(esf.value) },
      { id: "lsf", kind: "lsf", axis: "normal", positionMm: Array.from(chain.lsfPositionMm), value: Array.from(chain.lsf) },
    ],
    roi: frameRegionToRoi(frame, uMinUsed, uMaxUsed, v0, v1),
    warnings,
    details: {
      orientation: frame.orientation,
      signedEdgeAngleDeg: signedAngleDeg,
      edgeOffsetPx: frame.acrossOrigin + edgeAt(centreAlong) - (frame.imageAcross - 1) / 2,
      polarity: contrast >= 0 ? "dark-to-bright" : "bright-to-dark",
      lowSideValue: lowSide,
      highSideValue: highSide,
      contrast,
      noiseSd,
      contrastToNoise: Number.isFinite(cnr) ? cnr : null,
      mtfNoiseAtNyquist,
      rowsUsed,
      rowsAvailable: frame.rows,
      phaseCycles: rowsUsed * slope,
      pixelsUsed,
      esfRangeMm: [-leftPx * pu, rightPx * pu],
      binWidthMm,
      emptyBins: esf.emptyBins,
      lineFitRmsPx: line.rmsPx,
      rowsFitted: line.pointsUsed,
      centroidHalfWindowPx: halfWindowPx,
      derivative: EDGE_SPREAD_DEFAULTS.derivative,
      window: EDGE_SPREAD_DEFAULTS.window,
      fftLength: chain.fftLength,
    },
  };
}
