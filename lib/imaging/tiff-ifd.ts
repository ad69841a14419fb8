/**
 * Bounds-checked reader of a TIFF file's first Image File Directory (TIFF 6.0 §2: header, IFD entries of 12 bytes,
 * values inline when ≤ 4 bytes, else at an offset). Written here rather than taking utif's directory parser because
 * that one trusts counts and offsets from the file (a damaged file can make it loop for billions of iterations or
 * follow a cycle); utif is used only to decompress the strips/tiles of the IFD read here.
 */
import { ImageDecodeError } from "./image-decode-error";

/** Numeric tag values by "t<tag>", the shape utif.decodeImage expects. */
export type TiffIfd = Record<`t${number}`, number[]>;

/** Bytes per value of TIFF field types 1–12 (TIFF 6.0 §2 "Types"); ASCII and UNDEFINED are skipped. */
const TYPE_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8 };

export interface TiffDirectory {
  littleEndian: boolean;
  ifd: TiffIfd;
  /** True when further IFDs (pages) follow the first. */
  morePages: boolean;
}

/**
 * Reads IFD 0 with every value range checked against the file length.
 * @throws ImageDecodeError "truncated" when an offset points past the end of the file, "malformed" for BigTIFF or an
 *   absurd entry count.
 */
export function readFirstIfd(bytes: Uint8Array): TiffDirectory {
  if (bytes.length < 8) throw new ImageDecodeError("truncated", `the TIFF file is truncated: ${bytes.length} bytes`);
  const littleEndian = bytes[0] === 0x49;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const u16 = (o: number) => view.getUint16(o, littleEndian);
  const u32 = (o: number) => view.getUint32(o, littleEndian);
  if (u16(2) === 43) throw new ImageDecodeError("malformed", "BigTIFF files are not supported; save the image as a standard TIFF");
  const ifdOffset = u32(4);
  const past = (end: number, what: string) => {
    if (end > bytes.length) throw new ImageDecodeError("truncated", `the TIFF file is truncated: ${what} lies beyond its ${bytes.length} bytes`);
  };
  past(ifdOffset + 2, "the first image directory");
  const count = u16(ifdOffset);
  if (count === 0) throw new ImageDecodeError("malformed", "the TIFF image directory is empty");
  past(ifdOffset + 2 + 12 * count + 4, "the first image directory");

  const ifd: TiffIfd = {};
  for (let k = 0; k < count; k++) {
    const entry = ifdOffset + 2 + 12 * k;
    const tag = u16(entry);
    const type = u16(entry + 2);
    const n = u32(entry + 4);
    const size = TYPE_SIZE[type];
    if (!size || type === 2 || type === 7) continue; // text, opaque or unknown types: not needed for the pixels
    const total = size * n;
    const at = total <= 4 ? entry + 8 : u32(entry + 8);
    past(at + total, `the value of tag ${tag}`);
    const values: number[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const o = at + i * size;
      switch (type) {
        case 1: values[i] = view.getUint8(o); break;
        case 3: values[i] = u16(o); break;
        case 4: values[i] = u32(o); break;
        case 5: values[i] = u32(o) / u32(o + 4); break;
        case 6: values[i] = view.getInt8(o); break;
        case 8: values[i] = view.getInt16(o, littleEndian); break;
        case 9: values[i] = view.getInt32(o, littleEndian); break;
        case 10: values[i] = view.getInt32(o, littleEndian) / view.getInt32(o + 4, littleEndian); break;
        case 11: values[i] = view.getFloat32(o, littleEndian); break;
        default: values[i] = view.getFloat64(o, littleEndian);
      }
    }
    ifd[`t${tag}`] = values;
  }
  const next = u32(ifdOffset + 2 + 12 * count);
  return { littleEndian, ifd, morePages: next !== 0 };
}

/** Checks that every strip or tile (offsets + byte counts) lies inside the file. */
export function checkSegments(ifd: TiffIfd, fileLength: number): void {
  const offsets = ifd.t273 ?? ifd.t324;
  const counts = ifd.t279 ?? ifd.t325;
  if (!offsets || !counts || offsets.length === 0 || offsets.length !== counts.length) {
    throw new ImageDecodeError("malformed", "the TIFF image has no consistent strip or tile offsets / byte counts");
  }
  for (let i = 0; i < offsets.length; i++) {
    if (offsets[i] + counts[i] > fileLength) {
      throw new ImageDecodeError("truncated", `the TIFF file is truncated: image segment ${i + 1} of ${offsets.length} ends at byte ${offsets[i] + counts[i]}, the file has ${fileLength}`);
    }
  }
}
