/**
 * DICOM Part 10 (PS3.10) greyscale image decoding: header parsing by dicom-parser, pixel unpacking, rescale and
 * MONOCHROME1 handling here.
 *
 * Supported: Implicit VR Little Endian, Explicit VR Little Endian, Explicit VR Big Endian, JPEG Lossless (process 14,
 * …4.57 and …4.70); Bits Allocated 8/16/32, signed/unsigned, any Bits Stored/High Bit; Float and Double Float Pixel
 * Data; MONOCHROME1/2; multi-frame. Everything else is rejected with an ImageDecodeError that says what to do.
 */
import { parseDicom, readPart10Header, type DataSet, type Element } from "dicom-parser";
import { DEFAULT_MAX_PIXELS, checkFiniteSamples, checkPixelLimit, type DecodeLimits, type DecodedImage } from "./decoded-image";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";
import { sniffDicomLayout, type DicomLayout } from "./sniff";
import { requireReadableTransferSyntax, type TransferSyntaxInfo } from "./transfer-syntax";
import { readDicomAttributes } from "./dicom-attributes";
import { readRescales, readSpacing } from "./dicom-header";
import { checkPixelCellLayout, storedValueRange, unpackPixelCells, type LinearTransform, type PixelCellLayout } from "./dicom-pixels";
import { decodeJpegLosslessFrames } from "./dicom-jpeg-lossless";
import { monochrome1Warning, readImagePixelModule, type ImagePixelModule } from "./dicom-image-pixel";

export type DicomDecodeOptions = DecodeLimits;

function describe(e: unknown): string {
  if (typeof e === "string") return e;
  if (e instanceof Error) return e.message;
  if (e && typeof e === "object" && "exception" in e) return describe((e as { exception: unknown }).exception);
  return String(e);
}

function isTruncation(message: string): boolean {
  return /past end of buffer|buffer overrun|eof encountered|maxPosition/i.test(message);
}

interface Parsed {
  dataSet: DataSet;
  transferSyntax: TransferSyntaxInfo;
  warnings: DecodeWarning[];
}

function parse(bytes: Uint8Array, layout: DicomLayout): Parsed {
  const warnings: DecodeWarning[] = [];
  let input = bytes;
  let transferSyntaxUid: string;
  if (layout.kind === "dataset-without-meta") {
    transferSyntaxUid = layout.transferSyntaxUid;
  } else {
    if (layout.kind === "meta-without-preamble") {
      input = new Uint8Array(132 + bytes.length);
      input.set([0x44, 0x49, 0x43, 0x4d], 128);
      input.set(bytes, 132);
    }
    let meta: DataSet;
    try {
      meta = readPart10Header(input);
    } catch (e) {
      const message = describe(e);
      if (isTruncation(message)) throw new ImageDecodeError("truncated", `the DICOM file ends inside its File Meta Information (${input.length} bytes); upload the complete file`);
      throw new ImageDecodeError("malformed", `the DICOM File Meta Information cannot be read: ${message}`);
    }
    const lengthElement = meta.elements.x00020000;
    const groupLength = lengthElement && lengthElement.dataOffset + 4 <= input.length ? meta.uint32("x00020000") : undefined;
    if (lengthElement && (groupLength === undefined || 132 + 12 + groupLength > input.length)) {
      throw new ImageDecodeError("truncated", `the DICOM file ends inside its File Meta Information (${input.length} bytes); upload the complete file`);
    }
    const uid = meta.string("x00020010");
    if (!uid) throw new ImageDecodeError("malformed", "the DICOM File Meta Information has no Transfer Syntax UID (0002,0010)");
    transferSyntaxUid = uid.replace(/\0/g, "").trim();
  }
  // Check the syntax before the full parse: unsupported files are refused without inflating or decoding anything.
  const transferSyntax = requireReadableTransferSyntax(transferSyntaxUid);
  if (layout.kind === "dataset-without-meta") {
    warnings.push({
      code: "no_file_meta",
      message: `the file has no DICOM File Meta Information; read as ${transferSyntax.name} (inferred from its first element)`,
    });
  }
  try {
    const options = layout.kind === "dataset-without-meta" ? { TransferSyntaxUID: transferSyntaxUid } : {};
    const dataSet = parseDicom(input, options);
    if (dataSet.warnings.some((w) => isTruncation(w))) {
      throw new ImageDecodeError("truncated", `the DICOM file ends before its last element is complete (${input.length} bytes); upload the complete file`);
    }
    return { dataSet, transferSyntax, warnings };
  } catch (e) {
    if (e instanceof ImageDecodeError) throw e;
    const message = describe(e);
    if (isTruncation(message)) {
      const partial = e && typeof e === "object" && "dataSet" in e ? (e as { dataSet?: DataSet }).dataSet : undefined;
      const pixel = partial?.elements.x7fe00010;
      const detail = pixel && pixel.length > 0
        ? `Pixel Data needs ${pixel.length} bytes from offset ${pixel.dataOffset} but the file has ${input.length} bytes`
        : `the data set stops in the middle of an element (${input.length} bytes)`;
      throw new ImageDecodeError("truncated", `the DICOM file is truncated: ${detail}; upload the complete file`);
    }
    throw new ImageDecodeError("malformed", `the DICOM data set cannot be parsed: ${message}`);
  }
}

function pixelDataElement(dataSet: DataSet): { element: Element; float: 0 | 32 | 64 } {
  const integer = dataSet.elements.x7fe00010;
  if (integer) return { element: integer, float: 0 };
  const float = dataSet.elements.x7fe00008;
  if (float) return { element: float, float: 32 };
  const double = dataSet.elements.x7fe00009;
  if (double) return { element: double, float: 64 };
  const sopClass = dataSet.string("x00080016");
  throw new ImageDecodeError(
    "no_pixel_data",
    `the DICOM object has no Pixel Data (7FE0,0010)${sopClass ? ` (SOP Class ${sopClass})` : ""}: it is not an image ` +
      `(e.g. a structured report, RT plan or presentation state); export the image itself`,
  );
}

/** Checks the native pixel data length against Rows × Columns × Frames; returns the warnings to add. */
function checkNativeLength(element: Element, bytesAvailable: number, module: ImagePixelModule, bytesPerCell: number): DecodeWarning[] {
  const frameBytes = module.rows * module.columns * bytesPerCell;
  const expected = frameBytes * module.frames;
  const what = `Rows ${module.rows} × Columns ${module.columns} × ${module.frames} frame(s) × ${bytesPerCell} byte(s)`;
  if (element.encapsulatedPixelData) {
    throw new ImageDecodeError("malformed", "Pixel Data is encapsulated (compressed) but the transfer syntax is uncompressed");
  }
  if (element.dataOffset + Math.min(element.length, expected) > bytesAvailable) {
    throw new ImageDecodeError(
      "truncated",
      `the DICOM file is truncated: ${what} = ${expected} bytes of Pixel Data expected, the file ends ${bytesAvailable - element.dataOffset} bytes into them; upload the complete file`,
    );
  }
  if (element.length < expected) {
    throw new ImageDecodeError("size_mismatch", `Pixel Data holds ${element.length} bytes but ${what} = ${expected} bytes; the header and the pixel data disagree`);
  }
  const excess = element.length - expected;
  if (excess >= frameBytes) {
    throw new ImageDecodeError(
      "size_mismatch",
      `Pixel Data holds ${element.length} bytes, room for ${Math.floor(element.length / frameBytes)} frames, but Number of Frames says ${module.frames}; the header and the pixel data disagree`,
    );
  }
  return excess > 1 ? [{ code: "pixel_data_padding", message: `Pixel Data has ${excess} bytes beyond ${what}; they were ignored` }] : [];
}

/**
 * Per-frame map from stored value to output value: the Rescale (value = slope · stored + intercept), followed for
 * MONOCHROME1 by the inversion v′ = R(min) + R(max) − v within the rescaled stored range, folded into one linear map.
 * Float pixel data have no rescale; MONOCHROME1 float data are negated.
 */
function frameTransforms(dataSet: DataSet, module: ImagePixelModule, cell: PixelCellLayout): LinearTransform[] {
  const rescales = cell.float ? null : readRescales(dataSet, module.frames);
  const range = storedValueRange(cell);
  const out: LinearTransform[] = [];
  for (let f = 0; f < module.frames; f++) {
    const r = rescales ? rescales[f] : { slope: 1, intercept: 0 };
    if (module.photometric !== "MONOCHROME1") out.push({ scale: r.slope, offset: r.intercept });
    else if (cell.float) out.push({ scale: -1, offset: 0 });
    else {
      const sum = r.slope * range.min + r.intercept + r.slope * range.max + r.intercept;
      out.push({ scale: -r.slope, offset: sum - r.intercept });
    }
  }
  return out;
}

/**
 * Decodes a DICOM file into physical values (see DecodedImage).
 *
 * Values: stored values (Bits Stored extracted from the cell at High Bit, sign-extended when Pixel Representation is 1)
 * × Rescale Slope + Rescale Intercept, per frame when functional groups give per-frame values. MONOCHROME1 images are
 * inverted within the rescaled stored range — v′ = R(min) + R(max) − v, with R the frame's rescale and min/max the
 * smallest/largest value Bits Stored can hold — so bright is high and the physical scale is kept. Float pixel data
 * are taken as they are (MONOCHROME1: negated).
 * @throws ImageDecodeError with codes not_an_image, truncated, malformed, no_pixel_data, size_mismatch,
 *   too_many_pixels, unsupported_transfer_syntax, unsupported_pixel_format. Never throws anything else for bad input.
 */
export function decodeDicom(bytes: Uint8Array, options: DicomDecodeOptions = {}): DecodedImage {
  try {
    return decodeDicomUnchecked(bytes, options);
  } catch (e) {
    if (e instanceof ImageDecodeError) throw e;
    // Safety net: dicom-parser and the JPEG decoder throw strings or plain errors on inputs not foreseen above.
    const message = describe(e);
    if (isTruncation(message)) throw new ImageDecodeError("truncated", `the DICOM file is truncated (${message}); upload the complete file`);
    throw new ImageDecodeError("malformed", `the DICOM file cannot be read: ${message}`);
  }
}

function decodeDicomUnchecked(bytes: Uint8Array, options: DicomDecodeOptions): DecodedImage {
  const layout = sniffDicomLayout(bytes);
  if (!layout) {
    throw new ImageDecodeError("not_an_image", "not a DICOM file: no \"DICM\" marker at byte 128 and no recognisable DICOM data set at the start");
  }
  const { dataSet, transferSyntax, warnings } = parse(bytes, layout);
  const { element, float } = pixelDataElement(dataSet);
  const module = readImagePixelModule(dataSet, float, warnings);
  checkPixelLimit(module.columns, module.rows, module.frames, options.maxPixels ?? DEFAULT_MAX_PIXELS);

  const cell: PixelCellLayout = {
    bitsAllocated: module.bitsAllocated,
    bitsStored: module.bitsStored,
    highBit: module.highBit,
    signed: module.signed,
    littleEndian: transferSyntax.littleEndian,
    float: float !== 0,
    swapBytePairs: !transferSyntax.littleEndian && module.bitsAllocated === 8 && element.vr === "OW",
  };
  checkPixelCellLayout(cell);

  const size = module.rows * module.columns;
  const data = new Float64Array(size * module.frames);
  const transforms = frameTransforms(dataSet, module, cell);
  if (transferSyntax.kind === "jpeg-lossless") {
    if (!element.encapsulatedPixelData) throw new ImageDecodeError("malformed", "JPEG Lossless transfer syntax but the Pixel Data is not encapsulated");
    decodeJpegLosslessFrames(dataSet, element, module.rows, module.columns, module.frames, cell, data, transforms);
  } else {
    warnings.push(...checkNativeLength(element, dataSet.byteArray.length, module, module.bitsAllocated >> 3));
    const frameBytes = size * (module.bitsAllocated >> 3);
    if (cell.swapBytePairs && size % 2 === 1) {
      // Swapped byte pairs straddle odd-sized frames: unpack everything, then map each frame.
      unpackPixelCells(dataSet.byteArray, element.dataOffset, size * module.frames, cell, data, 0);
      transforms.forEach((t, f) => {
        for (let i = f * size; i < (f + 1) * size; i++) data[i] = data[i] * t.scale + t.offset;
      });
    } else {
      for (let f = 0; f < module.frames; f++) {
        unpackPixelCells(dataSet.byteArray, element.dataOffset + f * frameBytes, size, cell, data, f * size, transforms[f]);
      }
    }
  }
  if (float) checkFiniteSamples(data, "the float Pixel Data");
  if (module.photometric === "MONOCHROME1") warnings.push(monochrome1Warning(float !== 0));

  const attributes = readDicomAttributes(dataSet);
  if (attributes.LossyImageCompression === "01") {
    warnings.push({ code: "lossy_compression_history", message: "Lossy Image Compression (0028,2110) is 01: the image was lossy-compressed at some point, which alters the MTF and noise" });
  }
  if (typeof attributes.PresentationIntentType === "string" && attributes.PresentationIntentType.toUpperCase() === "FOR PRESENTATION") {
    warnings.push({ code: "for_presentation", message: "the image is FOR PRESENTATION (processed for display); processing such as edge enhancement alters the MTF — use the FOR PROCESSING image for a detector MTF" });
  }
  const spacing = readSpacing(dataSet, module.frames, warnings);
  const modality = typeof attributes.Modality === "string" ? attributes.Modality : null;

  return {
    width: module.columns,
    height: module.rows,
    frames: module.frames,
    data,
    pixelSpacingMm: spacing.pixelSpacingMm,
    pixelSpacingSource: spacing.source,
    sliceSpacingMm: spacing.sliceSpacingMm,
    format: "dicom",
    transferSyntaxUid: transferSyntax.uid,
    photometricInterpretation: module.photometric,
    modality,
    attributes,
    warnings,
  };
}
