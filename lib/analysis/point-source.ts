/**
 * Point-source (PSF) analysis: FWHM/FWTM along x and y by the NEMA NU 2 / NU 1 direct method, a 2-D Gaussian fit
 * as a second estimate, and the 2-D MTF from the FFT of the background-subtracted PSF.
 *
 * Procedure:
 * 1. locate the source (3×3-smoothed maximum, then a thresholded centroid) inside options.roi or the whole image and
 *    reject the image when the source does not stand out from the noise;
 * 2. analysis ROI of ±max(16 px, 4 FWHM) around it, clipped to the image (warning "roi_at_image_border") and to
 *    options.roi; background level and noise SD from a 3-px border strip of that ROI (median and 1.4826·MAD);
 * 3. profiles: the mean of the 3 rows (for x) or 3 columns (for y) centred on the peak pixel, background-subtracted.
 *    This is the narrow-window summation of recent NU 2 editions at its narrowest useful width: for a separable PSF
 *    it has the same shape as the single row through the peak, with √3 less noise per sample from the band (less in
 *    practice, as the outer rows carry less signal);
 * 4. FWHM/FWTM of each profile by measureProfileWidth; fwhmMm and fwtmMm are the means of x and y;
 * 5. 2-D Gaussian least-squares fit on ±2 FWHM around the peak (details.gaussianFit);
 * 6. MTF: |2-D DFT| of the background-subtracted ROI, zero-padded to ≥ 128 per axis, normalised at f = 0; cuts along
 *    the u and v axes (mtfCurves.x, mtfCurves.y) and the radial average (primary mtf). The central-slice theorem makes
 *    the axis cuts equal to the MTFs of the projected LSFs (summed over the whole ROI), i.e. the presampled MTF of the
 *    system including the pixel aperture. Nyquist = 1/(2·max(px, py)).
 */
import { AnalysisError } from "./errors";
import { assertRoiInImage, measureBackground } from "./background";
import { amplitudeSpectrum2d, normaliseAtZeroFrequency, spectrumAxisCut, spectrumRadialAverage } from "./fft-2d";
import { nextPowerOfTwo } from "./fft";
import { fitGaussian2d } from "./fit-gaussian";
import { locatePointSource, roiAroundSource } from "./locate-peak";
import { summariseMtf } from "./mtf-metrics";
import { fwhmAndFwtm } from "./profile-width";
import { ANALYSIS_VERSION, type AnalysisResult, type AnalysisWarning, type GaussianFit2d, type GrayImage, type Roi } from "./types";

export interface PointSourceSettings {
  /** Profiles average the rows/columns within ± this many pixels of the peak pixel. */
  profileBandHalfWidthPx: number;
  /** Below this (peak − background)/noise SD the image is rejected ("no_source"). */
  minPeakToNoise: number;
  /** Below this (peak − background)/noise SD a "low_snr" warning is given. */
  lowSnrPeakToNoise: number;
  /** A FWHM below this many pixels (x or y) gives an "undersampled" warning. */
  undersampledFwhmPx: number;
  /** Half-size of the Gaussian-fit window in FWHMs (at least 3 px). */
  fitHalfSizePerFwhm: number;
  /** Minimum zero-padded FFT size per axis. */
  minFftSize: number;
}

/** Settings of {@link analysePointSource}. */
export const POINT_SOURCE_DEFAULTS: PointSourceSettings = {
  profileBandHalfWidthPx: 1,
  minPeakToNoise: 5,
  lowSnrPeakToNoise: 20,
  undersampledFwhmPx: 3,
  fitHalfSizePerFwhm: 2,
  minFftSize: 128,
};

/** Throws AnalysisError unless the image has consistent size, data and positive spacing. */
export function assertAnalysableImage(image: GrayImage, minSizePx: number): void {
  const { width, height, data, pixelSpacingMm } = image;
  if (data.length !== width * height) throw new AnalysisError(`image data length ${data.length} does not match ${width}×${height}`);
  if (width < minSizePx || height < minSizePx) {
    throw new AnalysisError(`image must be at least ${minSizePx}×${minSizePx} px, got ${width}×${height}`);
  }
  if (!(pixelSpacingMm.x > 0 && pixelSpacingMm.y > 0)) {
    throw new AnalysisError(`pixel spacing must be positive, got ${pixelSpacingMm.x}×${pixelSpacingMm.y} mm`);
  }
}

/**
 * Analyses the image of a point source (method "point"); see the file header for the procedure.
 *
 * @param image row-major frame in physical units (bright source on a darker, flat background), spacing in mm.
 * @param options.roi optional search region (frame pixels); the analysis ROI is cut to it.
 * @returns AnalysisResult with FWHM/FWTM (mm; x, y and their mean), MTF in cycles/mm (radial primary, x/y cuts), MTF50,
 *   MTF10, MTF at Nyquist, spread curves "psf-x"/"psf-y" (mm from the parabolic peak, normalised to peak 1) and
 *   details { centreXPx, centreYPx, backgroundLevel, noiseSd, peakToNoise, fwhmXPx, fwhmYPx, profileBandRows,
 *   gaussianFit }. Warnings: "undersampled" (FWHM < 3 px), "low_snr" (peak/noise < 20), "roi_at_image_border",
 *   "gaussian_fit_failed".
 * @throws AnalysisError (code "no_source") when the peak is less than 5 noise SDs above the background; AnalysisError
 *   when the image or ROI is invalid or a profile does not fall to 10% of its peak inside the ROI.
 */
export function analysePointSource(image: GrayImage, options: { roi?: Roi } = {}): AnalysisResult {
  const settings = POINT_SOURCE_DEFAULTS;
  assertAnalysableImage(image, 9);
  const searchRoi = options.roi ?? { x: 0, y: 0, width: image.width, height: image.height };
  assertRoiInImage(image, searchRoi);
  const { x: px, y: py } = image.pixelSpacingMm;
  const warnings: AnalysisWarning[] = [];

  const located = locatePointSource(image, searchRoi);
  const detectionNoise = located.background.noiseSd;
  const detectionPeak = located.peakValue - located.background.level;
  if (!(detectionPeak > 0) || detectionPeak < settings.minPeakToNoise * detectionNoise) {
    const ratio = detectionNoise > 0 ? (detectionPeak / detectionNoise).toFixed(1) : "0";
    throw new AnalysisError(
      `no point source found: the brightest spot is ${ratio} noise SDs above the background, need at least ` +
        `${settings.minPeakToNoise}; check that the source is inside the image or ROI, or acquire more counts`,
      "no_source",
    );
  }

  const { roi, clippedByImage } = roiAroundSource(
    image,
    { xPx: located.centreXPx, yPx: located.centreYPx },
    { x: located.roughFwhmXPx, y: located.roughFwhmYPx },
    searchRoi,
  );
  if (clippedByImage) {
    warnings.push({
      code: "roi_at_image_border",
      message: `the source at (${located.centreXPx.toFixed(1)}, ${located.centreYPx.toFixed(1)}) px is too close to the image edge for a full ROI; tails and background are truncated`,
    });
  }
  if (roi.width < 9 || roi.height < 9) {
    throw new AnalysisError(`point-source ROI must be at least 9×9 px, got ${roi.width}×${roi.height}; move the ROI onto the source`);
  }
  const background = measureBackground(image, roi);

  const peakCol = Math.round(located.centreXPx);
  const peakRow = Math.round(located.centreYPx);
  const profileX = bandProfile(image, roi, "x", peakRow, settings.profileBandHalfWidthPx, background.level);
  const profileY = bandProfile(image, roi, "y", peakCol, settings.profileBandHalfWidthPx, background.level);
  const widthX = fwhmAndFwtm(profileX, px);
  const widthY = fwhmAndFwtm(profileY, py);
  const fwhmXPx = widthX.fwhm.widthMm / px;
  const fwhmYPx = widthY.fwhm.widthMm / py;
  if (Math.min(fwhmXPx, fwhmYPx) < settings.undersampledFwhmPx) {
    warnings.push({
      code: "undersampled",
      message: `FWHM is ${Math.min(fwhmXPx, fwhmYPx).toFixed(2)} px, below ${settings.undersampledFwhmPx} px; the NEMA width is biased upwards and the MTF aliased — use smaller pixels`,
    });
  }
  const peakToNoise = background.noiseSd > 0 ? widthX.fwhm.peakValue / background.noiseSd : Infinity;
  if (peakToNoise < settings.lowSnrPeakToNoise) {
    warnings.push({
      code: "low_snr",
      message: `peak is ${peakToNoise.toFixed(1)} noise SDs above the background, below ${settings.lowSnrPeakToNoise}; FWTM and MTF are noisy — acquire more counts`,
    });
  }

  const gaussianFit = fitPsf(image, roi, located, background.level, widthX.fwhm.peakValue, { x: fwhmXPx, y: fwhmYPx }, settings, warnings);

  const psf = new Float64Array(roi.width * roi.height);
  for (let row = 0; row < roi.height; row++) {
    const offset = (roi.y + row) * image.width + roi.x;
    for (let col = 0; col < roi.width; col++) psf[row * roi.width + col] = image.data[offset + col]! - background.level;
  }
  const spectrum = amplitudeSpectrum2d(
    { data: psf, width: roi.width, height: roi.height, pixelSpacingMm: image.pixelSpacingMm },
    {
      paddedWidth: Math.max(settings.minFftSize, nextPowerOfTwo(roi.width)),
      paddedHeight: Math.max(settings.minFftSize, nextPowerOfTwo(roi.height)),
    },
  );
  const mtf = normaliseAtZeroFrequency(spectrumRadialAverage(spectrum));
  const mtfX = normaliseAtZeroFrequency(spectrumAxisCut(spectrum, "x"));
  const mtfY = normaliseAtZeroFrequency(spectrumAxisCut(spectrum, "y"));
  const nyquist = 1 / (2 * Math.max(px, py));
  const summary = summariseMtf(mtf, nyquist);

  return {
    method: "point",
    version: ANALYSIS_VERSION,
    pixelSpacingMm: image.pixelSpacingMm,
    fwhmMm: (widthX.fwhm.widthMm + widthY.fwhm.widthMm) / 2,
    fwtmMm: (widthX.fwtm.widthMm + widthY.fwtm.widthMm) / 2,
    fwhmXMm: widthX.fwhm.widthMm,
    fwhmYMm: widthY.fwhm.widthMm,
    fwtmXMm: widthX.fwtm.widthMm,
    fwtmYMm: widthY.fwtm.widthMm,
    mtf50: summary.mtf50,
    mtf10: summary.mtf10,
    nyquist,
    mtfAtNyquist: summary.mtfAtNyquist,
    mtf,
    mtfCurves: { x: mtfX, y: mtfY },
    spread: [
      spreadCurve("psf-x", "x", profileX, widthX.fwhm.peakPositionPx, widthX.fwhm.peakValue, px),
      spreadCurve("psf-y", "y", profileY, widthY.fwhm.peakPositionPx, widthY.fwhm.peakValue, py),
    ],
    roi,
    warnings,
    details: {
      centreXPx: roi.x + widthX.fwhm.peakPositionPx,
      centreYPx: roi.y + widthY.fwhm.peakPositionPx,
      backgroundLevel: background.level,
      noiseSd: background.noiseSd,
      peakToNoise: Number.isFinite(peakToNoise) ? peakToNoise : null,
      fwhmXPx,
      fwhmYPx,
      profileBandRows: 2 * settings.profileBandHalfWidthPx + 1,
      gaussianFit,
    },
  };
}

/**
 * Background-subtracted mean of the rows (axis "x") or columns (axis "y") within ±halfBand of `centre`, across the
 * whole ROI; the band is cut to the ROI.
 */
function bandProfile(image: GrayImage, roi: Roi, axis: "x" | "y", centre: number, halfBand: number, background: number): Float64Array {
  const length = axis === "x" ? roi.width : roi.height;
  const lo = Math.max(centre - halfBand, axis === "x" ? roi.y : roi.x);
  const hi = Math.min(centre + halfBand, axis === "x" ? roi.y + roi.height - 1 : roi.x + roi.width - 1);
  const profile = new Float64Array(length);
  for (let band = lo; band <= hi; band++) {
    for (let i = 0; i < length; i++) {
      const x = axis === "x" ? roi.x + i : band;
      const y = axis === "x" ? band : roi.y + i;
      profile[i] += image.data[y * image.width + x]! - background;
    }
  }
  for (let i = 0; i < length; i++) profile[i] /= hi - lo + 1;
  return profile;
}

function fitPsf(
  image: GrayImage,
  roi: Roi,
  located: { centreXPx: number; centreYPx: number },
  backgroundLevel: number,
  peakAboveBackground: number,
  fwhmPx: { x: number; y: number },
  settings: PointSourceSettings,
  warnings: AnalysisWarning[],
): GaussianFit2d | null {
  const halfX = Math.max(3, Math.ceil(settings.fitHalfSizePerFwhm * fwhmPx.x));
  const halfY = Math.max(3, Math.ceil(settings.fitHalfSizePerFwhm * fwhmPx.y));
  const cx = Math.round(located.centreXPx);
  const cy = Math.round(located.centreYPx);
  const x0 = Math.max(roi.x, cx - halfX);
  const y0 = Math.max(roi.y, cy - halfY);
  const x1 = Math.min(roi.x + roi.width - 1, cx + halfX);
  const y1 = Math.min(roi.y + roi.height - 1, cy + halfY);
  const sigmaMm = ((fwhmPx.x * image.pixelSpacingMm.x + fwhmPx.y * image.pixelSpacingMm.y) / 2) / (2 * Math.sqrt(2 * Math.LN2));
  try {
    return fitGaussian2d(
      image,
      { x: x0, y: y0, width: x1 - x0 + 1, height: y1 - y0 + 1 },
      { centreXPx: located.centreXPx, centreYPx: located.centreYPx, sigmaMm, amplitude: peakAboveBackground, background: backgroundLevel },
    );
  } catch (error) {
    if (!(error instanceof AnalysisError)) throw error;
    warnings.push({ code: "gaussian_fit_failed", message: `2-D Gaussian fit failed: ${error.message}` });
    return null;
  }
}

/** Spread curve with positions in mm from the parabolic peak and values normalised to the parabolic peak value. */
function spreadCurve(id: string, axis: "x" | "y", profile: Float64Array, peakPositionPx: number, peakValue: number, spacingMm: number) {
  return {
    id,
    kind: "psf" as const,
    axis,
    positionMm: Array.from(profile, (_, i) => (i - peakPositionPx) * spacingMm),
    value: Array.from(profile, (v) => v / peakValue),
  };
}
