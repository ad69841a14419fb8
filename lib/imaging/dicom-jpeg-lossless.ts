/**
 * JPEG Lossless (ITU-T T.81 process 14, Annex H) pixel data of DICOM transfer syntaxes 1.2.840.10008.1.2.4.57 and
 * .70, decoded frame by frame with jpeg-lossless-decoder-js. Encapsulation per PS3.5 §A.4: one frame per item, or
 * frames spread over several fragments and located through the Basic Offset Table.
 */
import { Decoder } from "jpeg-lossless-decoder-js";
import {
  createJPEGBasicOffsetTable,
  readEncapsulatedImageFrame,
  readEncapsulatedPixelDataFromFragments,
  type DataSet,
  type Element,
} from "dicom-parser";
import { ImageDecodeError } from "./image-decode-error";
import { unpackPixelCells, type LinearTransform, type PixelCellLayout } from "./dicom-pixels";

/** Frame f's compressed bytes. */
function frameBytes(dataSet: DataSet, element: Element, frame: number, frames: number): Uint8Array {
  const fragments = element.fragments ?? [];
  if (fragments.length === 0) throw new ImageDecodeError("malformed", "encapsulated Pixel Data has no fragments");
  if (frames === 1) return readEncapsulatedPixelDataFromFragments(dataSet, element, 0, fragments.length);
  const bot = element.basicOffsetTable ?? [];
  if (bot.length === frames) return readEncapsulatedImageFrame(dataSet, element, frame);
  if (fragments.length === frames) return readEncapsulatedPixelDataFromFragments(dataSet, element, frame, 1);
  return readEncapsulatedImageFrame(dataSet, element, frame, createJPEGBasicOffsetTable(dataSet, element));
}

/**
 * Decodes every frame into `out` (frames × rows × columns stored values, masked/sign-extended per `layout`, then
 * mapped through the frame's transform).
 * @throws ImageDecodeError "unsupported_pixel_format" for colour JPEG or Bits Allocated 32, "size_mismatch" when a
 *   frame's JPEG dimensions differ from Rows/Columns, "malformed" for a corrupt JPEG stream.
 */
export function decodeJpegLosslessFrames(
  dataSet: DataSet,
  element: Element,
  rows: number,
  columns: number,
  frames: number,
  layout: PixelCellLayout,
  out: Float64Array,
  transforms: LinearTransform[],
): void {
  if (layout.bitsAllocated !== 8 && layout.bitsAllocated !== 16) {
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      `JPEG Lossless pixel data with Bits Allocated ${layout.bitsAllocated} is not supported (8 or 16 only)`,
    );
  }
  const bytesPerSample = layout.bitsAllocated >> 3;
  const size = rows * columns;
  for (let f = 0; f < frames; f++) {
    let compressed: Uint8Array;
    try {
      compressed = frameBytes(dataSet, element, f, frames);
    } catch (e) {
      if (e instanceof ImageDecodeError) throw e;
      throw new ImageDecodeError("malformed", `cannot locate JPEG frame ${f + 1} of ${frames} in the encapsulated Pixel Data: ${String(e)}`);
    }
    const decoder = new Decoder();
    let decoded: Uint8Array | Uint16Array;
    try {
      // Own copy: the decoder reads from an ArrayBuffer and must not see the rest of the file.
      const copy = new Uint8Array(compressed); // a copy (Buffer#slice would return a view)
      decoded = decoder.decode(copy.buffer, 0, copy.byteLength, bytesPerSample) as Uint8Array | Uint16Array;
    } catch (e) {
      throw new ImageDecodeError("malformed", `JPEG Lossless frame ${f + 1} of ${frames} could not be decoded (${e instanceof Error ? e.message : String(e)}); the file may be corrupt or truncated`);
    }
    // The decoder reads past the end of a cut stream without complaint (it sees zeros); catch that here.
    if (decoder.stream && decoder.stream.index > decoder.stream.buffer.length) {
      throw new ImageDecodeError(
        "truncated",
        `JPEG Lossless frame ${f + 1} of ${frames} ends before all its pixels are coded (${compressed.length} bytes); the file is truncated or corrupt`,
      );
    }
    const components = decoder.numComp ?? 1;
    if (components !== 1) {
      throw new ImageDecodeError(
        "unsupported_pixel_format",
        `JPEG Lossless frame has ${components} colour components; Halfmax analyses greyscale images only`,
      );
    }
    const width = decoder.frame?.dimX;
    const height = decoder.frame?.dimY;
    if (width !== columns || height !== rows || decoded.length < size) {
      throw new ImageDecodeError(
        "size_mismatch",
        `JPEG frame ${f + 1} is ${width} × ${height} pixels but the header says Columns ${columns} × Rows ${rows}`,
      );
    }
    const cells = new Uint8Array(decoded.buffer, decoded.byteOffset, size * bytesPerSample);
    // Decoded samples are host-order (little endian) unsigned words holding the stored bit pattern.
    unpackPixelCells(cells, 0, size, { ...layout, littleEndian: true, swapBytePairs: false }, out, f * size, transforms[f]);
  }
}
