/**
 * Unpacking of DICOM pixel cells into stored values (PS3.5 §8.1.1 "Pixel data encoding of related data elements",
 * PS3.3 C.7.6.3.1.1–4): a cell of Bits Allocated bits holds a stored value of Bits Stored bits whose most significant
 * bit is High Bit; the other bits (old overlays, garbage) are discarded; Pixel Representation 1 means two's complement,
 * so the stored value is sign-extended from its top bit.
 */
import { ImageDecodeError } from "./image-decode-error";

export interface PixelCellLayout {
  /** 8, 16 or 32 for integer cells; 32 or 64 with `float` for Float / Double Float Pixel Data. */
  bitsAllocated: number;
  bitsStored: number;
  highBit: number;
  signed: boolean;
  littleEndian: boolean;
  /** Float Pixel Data (7FE0,0008) or Double Float Pixel Data (7FE0,0009): IEEE values, no bit fields. */
  float: boolean;
  /**
   * Big endian OW data with 8-bit cells: bytes are swapped in 16-bit words (PS3.5 §8.1.1 / Annex D), so the sample
   * order within each word is reversed.
   */
  swapBytePairs: boolean;
}

/** out = scale · stored + offset, applied while unpacking (rescale and MONOCHROME1 inversion in one pass). */
export interface LinearTransform {
  scale: number;
  offset: number;
}

/**
 * Copies `count` pixel cells starting at `bytes[offset]` into `out[outOffset …]` as stored values (integers, or the
 * float values of float pixel data), mapped through `transform` when given. Expects a layout accepted by
 * checkPixelCellLayout.
 */
export function unpackPixelCells(
  bytes: Uint8Array,
  offset: number,
  count: number,
  layout: PixelCellLayout,
  out: Float64Array,
  outOffset: number,
  transform?: LinearTransform,
): void {
  const identity = !transform || (transform.scale === 1 && transform.offset === 0);
  if (!identity && isFastPath(layout)) {
    // One pass over a typed view: the common case (full-width little-endian cells) with a rescale.
    const view = cellView(bytes, offset, count, layout);
    const { scale, offset: shift } = transform;
    for (let i = 0; i < count; i++) out[outOffset + i] = view[i] * scale + shift;
    return;
  }
  unpackStored(bytes, offset, count, layout, out, outOffset);
  if (!identity) {
    const { scale, offset: shift } = transform;
    for (let i = outOffset; i < outOffset + count; i++) out[i] = out[i] * scale + shift;
  }
}

function isFastPath(layout: PixelCellLayout): boolean {
  return layout.littleEndian && (layout.float || layout.bitsStored === layout.bitsAllocated);
}

/** Typed-array view of little-endian cells (copied once when misaligned). */
function cellView(bytes: Uint8Array, offset: number, count: number, layout: PixelCellLayout) {
  const bytesPerCell = layout.bitsAllocated >> 3;
  let src = bytes.subarray(offset, offset + count * bytesPerCell);
  // new Uint8Array(view) copies (Buffer#slice would not).
  if (src.byteOffset % bytesPerCell !== 0) src = new Uint8Array(src);
  if (layout.float) return layout.bitsAllocated === 64 ? new Float64Array(src.buffer, src.byteOffset, count) : new Float32Array(src.buffer, src.byteOffset, count);
  return typedView(src.buffer, src.byteOffset, count, layout.bitsAllocated, layout.signed);
}

function unpackStored(bytes: Uint8Array, offset: number, count: number, layout: PixelCellLayout, out: Float64Array, outOffset: number): void {
  if (isFastPath(layout)) {
    out.set(cellView(bytes, offset, count, layout), outOffset);
    return;
  }
  const bytesPerCell = layout.bitsAllocated >> 3;
  let src = bytes.subarray(offset, offset + count * bytesPerCell);
  if (src.byteOffset % bytesPerCell !== 0) src = new Uint8Array(src);
  const { buffer, byteOffset } = src;

  if (layout.float) {
    // Big endian (little endian took the fast path above).
    const dv = new DataView(buffer, byteOffset, count * bytesPerCell);
    if (layout.bitsAllocated === 64) for (let i = 0; i < count; i++) out[outOffset + i] = dv.getFloat64(i * 8, false);
    else for (let i = 0; i < count; i++) out[outOffset + i] = dv.getFloat32(i * 4, false);
    return;
  }

  const full = layout.bitsStored === layout.bitsAllocated; // then highBit = bitsAllocated − 1 (checked)

  // General path: read the raw cell as an unsigned integer, then extract the stored bits.
  const raw = readCellsUnsigned(buffer, byteOffset, count, layout);
  const shift = layout.highBit + 1 - layout.bitsStored;
  const bits = layout.bitsStored;
  if (full) {
    for (let i = 0; i < count; i++) out[outOffset + i] = raw[i];
    if (layout.signed) {
      const half = 2 ** (bits - 1);
      const range = 2 ** bits;
      for (let i = 0; i < count; i++) if (out[outOffset + i] >= half) out[outOffset + i] -= range;
    }
  } else if (layout.signed) {
    const up = 32 - bits;
    for (let i = 0; i < count; i++) out[outOffset + i] = ((raw[i] >>> shift) << up) >> up;
  } else {
    const mask = bits === 32 ? 0xffffffff : 2 ** bits - 1;
    for (let i = 0; i < count; i++) out[outOffset + i] = ((raw[i] >>> shift) & mask) >>> 0;
  }
}

function typedView(buffer: ArrayBufferLike, byteOffset: number, count: number, bitsAllocated: number, signed: boolean) {
  if (bitsAllocated === 8) return signed ? new Int8Array(buffer, byteOffset, count) : new Uint8Array(buffer, byteOffset, count);
  if (bitsAllocated === 16) return signed ? new Int16Array(buffer, byteOffset, count) : new Uint16Array(buffer, byteOffset, count);
  return signed ? new Int32Array(buffer, byteOffset, count) : new Uint32Array(buffer, byteOffset, count);
}

function readCellsUnsigned(buffer: ArrayBufferLike, byteOffset: number, count: number, layout: PixelCellLayout): Uint32Array | Uint16Array | Uint8Array {
  const { bitsAllocated, littleEndian } = layout;
  if (bitsAllocated === 8) {
    const cells = new Uint8Array(buffer, byteOffset, count);
    if (!layout.swapBytePairs) return cells;
    const swapped = new Uint8Array(count);
    for (let i = 0; i + 1 < count; i += 2) {
      swapped[i] = cells[i + 1];
      swapped[i + 1] = cells[i];
    }
    if (count % 2 === 1) swapped[count - 1] = cells[count - 1];
    return swapped;
  }
  if (littleEndian) return bitsAllocated === 16 ? new Uint16Array(buffer, byteOffset, count) : new Uint32Array(buffer, byteOffset, count);
  const dv = new DataView(buffer, byteOffset, count * (bitsAllocated >> 3));
  if (bitsAllocated === 16) {
    const cells = new Uint16Array(count);
    for (let i = 0; i < count; i++) cells[i] = dv.getUint16(i * 2, false);
    return cells;
  }
  const cells = new Uint32Array(count);
  for (let i = 0; i < count; i++) cells[i] = dv.getUint32(i * 4, false);
  return cells;
}

/**
 * Validates the bit layout read from the header.
 * @throws ImageDecodeError "unsupported_pixel_format" for Bits Allocated other than 8/16/32 (e.g. 1-bit
 *   segmentations), "malformed" for Bits Stored / High Bit outside the cell.
 */
export function checkPixelCellLayout(layout: PixelCellLayout): void {
  const { bitsAllocated, bitsStored, highBit } = layout;
  if (layout.float) {
    if (bitsAllocated !== 32 && bitsAllocated !== 64) {
      throw new ImageDecodeError("malformed", `float pixel data needs Bits Allocated 32 or 64, got ${bitsAllocated}`);
    }
    return;
  }
  if (bitsAllocated !== 8 && bitsAllocated !== 16 && bitsAllocated !== 32) {
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      `Bits Allocated ${bitsAllocated} is not supported (only 8, 16 or 32 bits per pixel); export a greyscale image with 8 or 16 bits`,
    );
  }
  if (!(Number.isInteger(bitsStored) && bitsStored >= 1 && bitsStored <= bitsAllocated)) {
    throw new ImageDecodeError("malformed", `Bits Stored must be from 1 to Bits Allocated (${bitsAllocated}), got ${bitsStored}`);
  }
  if (!(Number.isInteger(highBit) && highBit >= bitsStored - 1 && highBit <= bitsAllocated - 1)) {
    throw new ImageDecodeError(
      "malformed",
      `High Bit must be from Bits Stored − 1 (${bitsStored - 1}) to Bits Allocated − 1 (${bitsAllocated - 1}), got ${highBit}`,
    );
  }
}

/** Smallest and largest stored value representable with the layout (for MONOCHROME1 inversion). */
export function storedValueRange(layout: PixelCellLayout): { min: number; max: number } {
  const bits = layout.bitsStored;
  return layout.signed ? { min: -(2 ** (bits - 1)), max: 2 ** (bits - 1) - 1 } : { min: 0, max: 2 ** bits - 1 };
}
