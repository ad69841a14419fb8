/**
 * Format detection from the leading bytes of a file — never from its name.
 *
 * - DICOM Part 10: "DICM" at offset 128 (PS3.10 §7.1). Also accepted: a Part 10 file whose 128-byte preamble was
 *   stripped (starts with a group 0002 element in Explicit VR Little Endian), and a bare data set without File Meta
 *   information that starts with a group 0008 element (as some older systems write them).
 * - PNG: the 8-byte signature 89 50 4E 47 0D 0A 1A 0A (PNG spec §5.2).
 * - TIFF: "II" 2A 00 or "MM" 00 2A (TIFF 6.0 §2, image file header).
 */
import type { ImageFormat } from "./decoded-image";

export type SniffedFormat = Exclude<ImageFormat, "raw">;

/** How a DICOM byte stream starts; see sniffDicomLayout. */
export type DicomLayout =
  | { kind: "part10" }
  | { kind: "meta-without-preamble" }
  /** Bare data set: no File Meta, so the transfer syntax is inferred from the first element. */
  | { kind: "dataset-without-meta"; transferSyntaxUid: string };

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

const VALUE_REPRESENTATIONS = new Set(
  "AE AS AT CS DA DS DT FL FD IS LO LT OB OD OF OL OV OW PN SH SL SQ SS ST SV TM UC UI UL UN UR US UT UV".split(" "),
);

export const IMPLICIT_VR_LITTLE_ENDIAN = "1.2.840.10008.1.2";
export const EXPLICIT_VR_LITTLE_ENDIAN = "1.2.840.10008.1.2.1";
export const EXPLICIT_VR_BIG_ENDIAN = "1.2.840.10008.1.2.2";

function hasVrAt(bytes: Uint8Array, offset: number): boolean {
  if (bytes.length < offset + 2) return false;
  return VALUE_REPRESENTATIONS.has(String.fromCharCode(bytes[offset], bytes[offset + 1]));
}

/**
 * Layout of a DICOM stream, or null when the bytes do not look like DICOM. Heuristics for the preamble-less forms:
 * the first tag must be in group 0002 (meta) or 0008 with an element number ≤ 0x00FF, followed either by a valid VR
 * (explicit) or, little endian only, by a 32-bit length that fits in the file (implicit).
 */
export function sniffDicomLayout(bytes: Uint8Array): DicomLayout | null {
  if (
    bytes.length >= 132 &&
    bytes[128] === 0x44 &&
    bytes[129] === 0x49 &&
    bytes[130] === 0x43 &&
    bytes[131] === 0x4d
  ) {
    return { kind: "part10" };
  }
  if (bytes.length < 8) return null;
  const groupLe = bytes[0] | (bytes[1] << 8);
  const elementLe = bytes[2] | (bytes[3] << 8);
  const groupBe = (bytes[0] << 8) | bytes[1];
  const elementBe = (bytes[2] << 8) | bytes[3];
  if (groupLe === 0x0002 && elementLe <= 0x00ff && hasVrAt(bytes, 4)) return { kind: "meta-without-preamble" };
  if (groupLe === 0x0008 && elementLe <= 0x00ff) {
    if (hasVrAt(bytes, 4)) return { kind: "dataset-without-meta", transferSyntaxUid: EXPLICIT_VR_LITTLE_ENDIAN };
    const length = (bytes[4] | (bytes[5] << 8) | (bytes[6] << 16)) + bytes[7] * 0x1000000;
    if (length % 2 === 0 && length <= bytes.length - 8) {
      return { kind: "dataset-without-meta", transferSyntaxUid: IMPLICIT_VR_LITTLE_ENDIAN };
    }
  }
  if (groupBe === 0x0008 && elementBe <= 0x00ff && hasVrAt(bytes, 4)) {
    return { kind: "dataset-without-meta", transferSyntaxUid: EXPLICIT_VR_BIG_ENDIAN };
  }
  return null;
}

/** Format of an image file from its leading bytes; null when it is none of DICOM, PNG, TIFF. */
export function sniffImageFormat(bytes: Uint8Array): SniffedFormat | null {
  // DICM first: PS3.10 §7.5 allows a TIFF header in the preamble of a dual-format file; it is read as DICOM.
  if (sniffDicomLayout(bytes)?.kind === "part10") return "dicom";
  if (bytes.length >= 8 && PNG_SIGNATURE.every((b, i) => bytes[i] === b)) return "png";
  if (bytes.length >= 8) {
    const ii = bytes[0] === 0x49 && bytes[1] === 0x49 && bytes[2] === 0x2a && bytes[3] === 0x00;
    const mm = bytes[0] === 0x4d && bytes[1] === 0x4d && bytes[2] === 0x00 && bytes[3] === 0x2a;
    if (ii || mm) return "tiff";
  }
  return sniffDicomLayout(bytes) ? "dicom" : null;
}
