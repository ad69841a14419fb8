/**
 * The Image Pixel module attributes (PS3.3 C.7.6.3) that describe the pixel matrix, checked for what Halfmax can
 * analyse: one sample per pixel, MONOCHROME1 or MONOCHROME2.
 */
import type { DataSet } from "dicom-parser";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";

export interface ImagePixelModule {
  rows: number;
  columns: number;
  frames: number;
  bitsAllocated: number;
  bitsStored: number;
  highBit: number;
  signed: boolean;
  photometric: "MONOCHROME1" | "MONOCHROME2";
}

function requiredUint16(dataSet: DataSet, tag: string, name: string): number {
  const element = dataSet.elements[tag];
  const value = element && element.length >= 2 ? dataSet.uint16(tag) : undefined;
  if (value === undefined) throw new ImageDecodeError("malformed", `the DICOM image has no ${name}`);
  return value;
}

function optionalUint16(dataSet: DataSet, tag: string): number | undefined {
  const element = dataSet.elements[tag];
  return element && element.length >= 2 ? dataSet.uint16(tag) : undefined;
}

const COLOUR_ADVICE = "Halfmax analyses greyscale images only; export the image as MONOCHROME2 (greyscale)";

/**
 * Reads and checks the Image Pixel module. `float` is 32/64 for Float/Double Float Pixel Data, else 0.
 * @throws ImageDecodeError "malformed" for missing or zero Rows/Columns/Bits Allocated or a bad Number of Frames;
 *   "unsupported_pixel_format" for colour or palette images or more than one sample per pixel.
 */
export function readImagePixelModule(dataSet: DataSet, float: 0 | 32 | 64, warnings: DecodeWarning[]): ImagePixelModule {
  const rows = requiredUint16(dataSet, "x00280010", "Rows (0028,0010)");
  const columns = requiredUint16(dataSet, "x00280011", "Columns (0028,0011)");
  if (rows === 0 || columns === 0) throw new ImageDecodeError("malformed", `the DICOM image is empty: Rows ${rows}, Columns ${columns}`);

  const framesText = dataSet.string("x00280008");
  const frames = framesText === undefined || framesText === "" ? 1 : Number(framesText);
  if (!(Number.isInteger(frames) && frames >= 1)) {
    throw new ImageDecodeError("malformed", `Number of Frames (0028,0008) must be a positive integer, got "${framesText}"`);
  }

  const samples = optionalUint16(dataSet, "x00280002") ?? 1;
  const photometricText = (dataSet.string("x00280004") ?? "").toUpperCase();
  if (photometricText !== "" && photometricText !== "MONOCHROME1" && photometricText !== "MONOCHROME2") {
    const kind = photometricText === "PALETTE COLOR" ? "a colour palette image" : "a colour image";
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      `Photometric Interpretation ${photometricText} is ${kind}; ${COLOUR_ADVICE}`,
    );
  }
  if (samples !== 1) {
    throw new ImageDecodeError("unsupported_pixel_format", `the image has ${samples} samples per pixel (colour); ${COLOUR_ADVICE}`);
  }
  if (photometricText === "") {
    warnings.push({ code: "photometric_missing", message: "no Photometric Interpretation (0028,0004): read as MONOCHROME2" });
  }

  const bitsAllocated = float ? (optionalUint16(dataSet, "x00280100") ?? float) : requiredUint16(dataSet, "x00280100", "Bits Allocated (0028,0100)");
  const bitsStored = optionalUint16(dataSet, "x00280101") ?? bitsAllocated;
  const highBit = optionalUint16(dataSet, "x00280102") ?? bitsStored - 1;
  const signed = (optionalUint16(dataSet, "x00280103") ?? 0) === 1;
  return {
    rows,
    columns,
    frames,
    bitsAllocated,
    bitsStored,
    highBit,
    signed,
    photometric: photometricText === "MONOCHROME1" ? "MONOCHROME1" : "MONOCHROME2",
  };
}

export function monochrome1Warning(float: boolean): DecodeWarning {
  return {
    code: "monochrome1_inverted",
    message: float
      ? "MONOCHROME1 image (low values bright) negated so that bright is high"
      : "MONOCHROME1 image (low values bright) inverted within its stored range so that bright is high",
  };
}
