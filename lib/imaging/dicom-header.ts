/**
 * Geometry and value-transformation attributes of a DICOM image, read from the top level of the data set or, for
 * enhanced multi-frame objects, from the Shared / Per-frame Functional Groups (PS3.3 C.7.6.16: Pixel Measures
 * (0028,9110), Pixel Value Transformation (0028,9145)).
 */
import type { DataSet } from "dicom-parser";
import type { PixelSpacingMm } from "../analysis/types";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";

const SHARED_FUNCTIONAL_GROUPS = "x52009229";
const PER_FRAME_FUNCTIONAL_GROUPS = "x52009230";
const PIXEL_MEASURES = "x00289110";
const PIXEL_VALUE_TRANSFORMATION = "x00289145";

export const TAG = {
  pixelSpacing: "x00280030",
  imagerPixelSpacing: "x00181164",
  magnificationFactor: "x00181114",
  sliceThickness: "x00180050",
  spacingBetweenSlices: "x00180088",
  rescaleIntercept: "x00281052",
  rescaleSlope: "x00281053",
} as const;

/** First item's data set of a sequence element, if any. */
function firstItem(dataSet: DataSet | undefined, tag: string): DataSet | undefined {
  return dataSet?.elements[tag]?.items?.[0]?.dataSet;
}

function perFrameItem(dataSet: DataSet, frame: number): DataSet | undefined {
  return dataSet.elements[PER_FRAME_FUNCTIONAL_GROUPS]?.items?.[frame]?.dataSet;
}

/** Text of `tag` in the first of the data sets that has it. */
function firstText(sets: (DataSet | undefined)[], tag: string): string | undefined {
  for (const set of sets) {
    const element = set?.elements[tag];
    if (set && element && element.length > 0) {
      const text = set.string(tag);
      if (text !== undefined && text !== "") return text;
    }
  }
  return undefined;
}

/** Where to look for a Pixel Measures attribute: top level, Shared FG, first frame's Per-frame FG. */
function pixelMeasureSets(dataSet: DataSet): (DataSet | undefined)[] {
  const shared = firstItem(dataSet, SHARED_FUNCTIONAL_GROUPS);
  const frame0 = perFrameItem(dataSet, 0);
  return [dataSet, firstItem(shared, PIXEL_MEASURES), firstItem(frame0, PIXEL_MEASURES)];
}

/**
 * Parses a DS pair "row\column" (Δy\Δx, PS3.3 §10.7.1.3) into {x, y} mm; null when absent. A single value is used
 * for both directions with a warning; non-positive or unparsable values are reported as a warning and ignored.
 */
function parseSpacing(text: string | undefined, name: string, warnings: DecodeWarning[]): PixelSpacingMm | null {
  if (text === undefined) return null;
  const parts = text.split("\\").map((s) => Number(s.trim()));
  const [dy, dx] = parts.length >= 2 ? parts : [parts[0], parts[0]];
  if (!(Number.isFinite(dx) && dx > 0 && Number.isFinite(dy) && dy > 0)) {
    warnings.push({ code: "invalid_pixel_spacing", message: `${name} "${text}" is not two positive numbers; ignored` });
    return null;
  }
  if (parts.length < 2) {
    warnings.push({ code: "pixel_spacing_single_value", message: `${name} has one value (${text}); used for rows and columns` });
  }
  return { x: dx, y: dy };
}

export interface SpacingInfo {
  pixelSpacingMm: PixelSpacingMm | null;
  source: "PixelSpacing" | "ImagerPixelSpacing" | null;
  sliceSpacingMm: number | null;
}

/**
 * Pixel spacing: Pixel Spacing (0028,0030) (top level or Pixel Measures), else Imager Pixel Spacing (0018,1164) with a
 * warning that it is measured at the detector front plane. Slice spacing: Spacing Between Slices (0018,0088), else,
 * for multi-frame images, Slice Thickness (0018,0050) with a warning.
 */
export function readSpacing(dataSet: DataSet, frames: number, warnings: DecodeWarning[]): SpacingInfo {
  const sets = pixelMeasureSets(dataSet);
  const pixel = parseSpacing(firstText(sets, TAG.pixelSpacing), "Pixel Spacing (0028,0030)", warnings);
  const imager = parseSpacing(firstText([dataSet], TAG.imagerPixelSpacing), "Imager Pixel Spacing (0018,1164)", warnings);
  let pixelSpacingMm = pixel;
  let source: SpacingInfo["source"] = pixel ? "PixelSpacing" : null;
  if (pixel && imager && (Math.abs(pixel.x - imager.x) > 0.01 * imager.x || Math.abs(pixel.y - imager.y) > 0.01 * imager.y)) {
    warnings.push({
      code: "pixel_spacing_differs_from_imager",
      message:
        `Pixel Spacing (${pixel.y}\\${pixel.x} mm) differs from Imager Pixel Spacing (${imager.y}\\${imager.x} mm); ` +
        `Pixel Spacing was used (calibrated to the object plane; see Pixel Spacing Calibration Type (0028,0A02))`,
    });
  }
  if (!pixel && imager) {
    pixelSpacingMm = imager;
    source = "ImagerPixelSpacing";
    const magnification = Number(firstText([dataSet], TAG.magnificationFactor));
    const hint = Number.isFinite(magnification) && magnification > 0
      ? ` The file gives Estimated Radiographic Magnification Factor (0018,1114) = ${magnification}: divide by it for distances in the object plane.`
      : "";
    warnings.push({
      code: "imager_pixel_spacing",
      message:
        `pixel spacing taken from Imager Pixel Spacing (0018,1164), which is measured at the detector front plane: ` +
        `results are in detector-plane mm (right for a detector MTF with the edge on the detector).${hint}`,
    });
  }
  let sliceSpacingMm: number | null = null;
  const between = Number(firstText(sets, TAG.spacingBetweenSlices));
  if (Number.isFinite(between) && between > 0) sliceSpacingMm = between;
  else if (frames > 1) {
    const thickness = Number(firstText(sets, TAG.sliceThickness));
    if (Number.isFinite(thickness) && thickness > 0) {
      sliceSpacingMm = thickness;
      warnings.push({
        code: "slice_spacing_from_thickness",
        message: `no Spacing Between Slices (0018,0088): Slice Thickness (${thickness} mm) used as the frame spacing, which is wrong for overlapping or gapped reconstructions`,
      });
    }
  }
  return { pixelSpacingMm, source, sliceSpacingMm };
}

export interface Rescale {
  slope: number;
  intercept: number;
}

function parseRescale(set: DataSet | undefined): Rescale | null {
  if (!set) return null;
  const slopeText = firstText([set], TAG.rescaleSlope);
  const interceptText = firstText([set], TAG.rescaleIntercept);
  if (slopeText === undefined && interceptText === undefined) return null;
  const slope = slopeText === undefined ? 1 : Number(slopeText);
  const intercept = interceptText === undefined ? 0 : Number(interceptText);
  if (!(Number.isFinite(slope) && slope !== 0)) {
    throw new ImageDecodeError("malformed", `Rescale Slope (0028,1053) must be a non-zero number, got "${slopeText}"`);
  }
  if (!Number.isFinite(intercept)) {
    throw new ImageDecodeError("malformed", `Rescale Intercept (0028,1052) must be a number, got "${interceptText}"`);
  }
  return { slope, intercept };
}

/**
 * Rescale Slope/Intercept for each frame (value = slope · stored + intercept, PS3.3 C.11.1.1.2): Per-frame FG Pixel
 * Value Transformation, else Shared FG, else the top-level attributes, else identity.
 * @throws ImageDecodeError "malformed" for a zero or unparsable slope or intercept.
 */
export function readRescales(dataSet: DataSet, frames: number): Rescale[] {
  const shared = parseRescale(firstItem(firstItem(dataSet, SHARED_FUNCTIONAL_GROUPS), PIXEL_VALUE_TRANSFORMATION));
  const top = parseRescale(dataSet) ?? { slope: 1, intercept: 0 };
  const out: Rescale[] = [];
  for (let f = 0; f < frames; f++) {
    const own = parseRescale(firstItem(perFrameItem(dataSet, f), PIXEL_VALUE_TRANSFORMATION));
    out.push(own ?? shared ?? top);
  }
  return out;
}
