/**
 * Public entry of the Halfmax numerical core: types, errors, the four methods and {@link analyse}, which validates the
 * input once and dispatches on the method (choosing it from the image content when asked for "auto").
 */
import { detectMethodAndRegion } from "./auto-method";
import { analyseCircularEdge } from "./circular-edge";
import { AnalysisError } from "./errors";
import { analyseLineSource } from "./line-source";
import { regionInFrame } from "./object-region";
import { analysePointSource } from "./point-source";
import { analyseSlantedEdge } from "./slanted-edge";
import { ANALYSIS_METHODS, type AnalysisMethod, type AnalysisOptions, type AnalysisResult, type GrayImage, type Roi } from "./types";

export * from "./types";
export { AnalysisError } from "./errors";
export { detectMethod, AUTO_METHOD_DEFAULTS, type MethodChoiceResult } from "./auto-method";
export { analysePointSource, POINT_SOURCE_DEFAULTS } from "./point-source";
export { analyseLineSource } from "./line-source";
export { analyseSlantedEdge, SLANTED_EDGE_DEFAULTS } from "./slanted-edge";
export { analyseCircularEdge, CIRCULAR_EDGE_DEFAULTS } from "./circular-edge";
export { frequencyAtLevel, valueAtFrequency, summariseMtf, type MtfSummary } from "./mtf-metrics";

/** Limits checked by {@link analyse} before any method runs (methods add their own, stricter ones). */
export const ANALYSE_DEFAULTS = {
  /** Smallest ROI side, pixels. */
  minRoiSizePx: 9,
  /** Smallest image side, pixels. */
  minImageSizePx: 9,
} as const;

const RUNNERS: Record<AnalysisMethod, (image: GrayImage, options: { roi?: Roi }) => AnalysisResult> = {
  point: analysePointSource,
  line: analyseLineSource,
  edge: analyseSlantedEdge,
  disk: analyseCircularEdge,
};

/**
 * Analyses one frame by the requested method.
 * @param image row-major frame (data[y·width + x]), physical values, pixel spacing in mm.
 * @param options.method "point" | "line" | "edge" | "disk" | "auto" (default): "auto" runs {@link detectMethod} on the
 *   ROI (or the whole image) and records its reasoning in details.autoMethodReason.
 * @param options.roi optional rectangle in frame pixels (integer bounds, inside the image, ≥ minRoiSizePx per side).
 * @returns the method's AnalysisResult (units: mm, cycles/mm; MTF 1 at f = 0). details.methodChoice is "auto" or
 *   "requested".
 * @throws AnalysisError for an invalid image (size, data length, spacing, non-finite values), an unknown method, an
 *   invalid ROI, when "auto" finds no object, or when the method cannot analyse the image (its message says why).
 */
export function analyse(image: GrayImage, options: AnalysisOptions = {}): AnalysisResult {
  validateImage(image);
  const choice = options.method ?? "auto";
  if (choice !== "auto" && !ANALYSIS_METHODS.includes(choice)) {
    throw new AnalysisError(`unknown analysis method "${String(choice)}"; expected auto, ${ANALYSIS_METHODS.join(", ")}`);
  }
  if (options.roi) validateRoi(image, options.roi);
  const methodOptions = options.roi ? { roi: options.roi } : {};
  if (choice !== "auto") {
    const result = RUNNERS[choice](image, methodOptions);
    return { ...result, details: { ...result.details, methodChoice: "requested" } };
  }
  const { choice: detected, region } = detectMethodAndRegion(options.roi ? cropImage(image, options.roi) : image);
  // The disk method starts from the object region the choice was based on instead of searching for it again.
  const result =
    detected.method === "disk" && region
      ? analyseCircularEdge(image, { ...methodOptions, region: options.roi ? regionInFrame(region, options.roi) : region })
      : RUNNERS[detected.method](image, methodOptions);
  return { ...result, details: { ...result.details, methodChoice: "auto", autoMethodReason: detected.reason } };
}

function validateImage(image: GrayImage): void {
  const { width, height, data, pixelSpacingMm } = image;
  const min = ANALYSE_DEFAULTS.minImageSizePx;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < min || height < min) {
    throw new AnalysisError(`image must be at least ${min}×${min} px with integer size, got ${width}×${height}`);
  }
  if (data.length !== width * height) {
    throw new AnalysisError(`image data holds ${data.length} values, expected ${width}×${height} = ${width * height}`);
  }
  const { x, y } = pixelSpacingMm;
  if (!(x > 0 && y > 0 && Number.isFinite(x) && Number.isFinite(y))) {
    throw new AnalysisError(`pixel spacing must be finite and positive, got ${x}×${y} mm`);
  }
  for (let i = 0; i < data.length; i++) {
    if (!Number.isFinite(data[i]!)) {
      throw new AnalysisError(`image value at pixel (${i % width}, ${Math.floor(i / width)}) is not finite: ${data[i]}`);
    }
  }
}

function validateRoi(image: GrayImage, roi: Roi): void {
  const { x, y, width, height } = roi;
  if (![x, y, width, height].every(Number.isInteger)) {
    throw new AnalysisError(`ROI bounds must be integers, got x=${x} y=${y} width=${width} height=${height}`);
  }
  const min = ANALYSE_DEFAULTS.minRoiSizePx;
  if (width < min || height < min) throw new AnalysisError(`ROI must be at least ${min}×${min} px, got ${width}×${height}`);
  if (x < 0 || y < 0) throw new AnalysisError(`ROI origin must not be negative, got (${x}, ${y})`);
  if (x + width > image.width || y + height > image.height) {
    throw new AnalysisError(
      `ROI ${width}×${height} at (${x}, ${y}) reaches (${x + width - 1}, ${y + height - 1}), outside the ${image.width}×${image.height} image`,
    );
  }
}

function cropImage(image: GrayImage, roi: Roi): GrayImage {
  const data = new Float64Array(roi.width * roi.height);
  for (let row = 0; row < roi.height; row++) {
    const src = (roi.y + row) * image.width + roi.x;
    data.set(image.data.subarray(src, src + roi.width), row * roi.width);
  }
  return { data, width: roi.width, height: roi.height, pixelSpacingMm: image.pixelSpacingMm };
}
