/**
 * Writes greyscale images as DICOM Part 10 files (PS3.10 §7: 128-byte preamble, "DICM", File Meta Information in
 * Explicit VR Little Endian with its group length, then the data set in the chosen transfer syntax). Used to turn
 * synthetic phantoms into DICOM for tests, the demo data and benchmarks — not a general DICOM toolkit.
 */
import type { PixelSpacingMm } from "../analysis/types";
import { DICOM_ATTRIBUTES } from "./dicom-attributes";
import {
  encodeElements,
  formatDecimalString,
  formatIntegerString,
  textValue,
  uint16Value,
  uint32Value,
  type EncodedElement,
} from "./dicom-element-encoder";
import { quantise, storedRange } from "./dicom-quantise";
import { HALFMAX_IMPLEMENTATION_CLASS_UID, HALFMAX_IMPLEMENTATION_VERSION_NAME, checkUid, newUid } from "./dicom-uid";
import { EXPLICIT_VR_BIG_ENDIAN, EXPLICIT_VR_LITTLE_ENDIAN, IMPLICIT_VR_LITTLE_ENDIAN } from "./sniff";
import { defaultSopClassUid, encodePixelCells } from "./dicom-writer-pixels";

export interface DicomWriteImage {
  width: number;
  height: number;
  /** Default 1. */
  frames?: number;
  /** Physical values (MONOCHROME2 sense, bright = high), frames × height × width, row-major. */
  data: ArrayLike<number>;
  /** Written as Pixel Spacing (0028,0030) "y\x", or Imager Pixel Spacing with `useImagerPixelSpacing`; null: none. */
  pixelSpacingMm: PixelSpacingMm | null;
  /** Written as Spacing Between Slices (0018,0088) when given. */
  sliceSpacingMm?: number | null;
}

export type DicomTransferSyntaxChoice = "explicit-le" | "implicit-le" | "explicit-be";

export interface DicomWriteOptions {
  transferSyntax: DicomTransferSyntaxChoice;
  bitsAllocated: 8 | 16 | 32;
  /** Default = bitsAllocated; High Bit is bitsStored − 1. */
  bitsStored?: number;
  signed: boolean;
  /** Fix the rescale; otherwise it is chosen to fit the data range (see quantise). */
  rescaleSlope?: number;
  rescaleIntercept?: number;
  /** MONOCHROME1 writes the inverted grey scale (stored = min + max − q), which a MONOCHROME1 reader shows unchanged. */
  photometric?: "MONOCHROME1" | "MONOCHROME2";
  modality: string;
  /** Default chosen from modality and frame count (see defaultSopClassUid). */
  sopClassUid?: string;
  useImagerPixelSpacing?: boolean;
  /** Header attributes by keyword (any of DICOM_ATTRIBUTES not set by the writer itself), e.g. Manufacturer, KVP. */
  attributes?: Record<string, string | number>;
  uids?: { studyInstanceUid?: string; seriesInstanceUid?: string; sopInstanceUid?: string };
}

/** Attributes the writer sets from the image and options; passing them in `attributes` is an error. */
const WRITER_OWNED = new Set([
  "SOPClassUID", "SOPInstanceUID", "StudyInstanceUID", "SeriesInstanceUID", "Modality", "Rows", "Columns",
  "NumberOfFrames", "BitsAllocated", "BitsStored", "HighBit", "PixelRepresentation", "PixelSpacing",
  "ImagerPixelSpacing", "RescaleSlope", "RescaleIntercept", "PhotometricInterpretation", "SpacingBetweenSlices",
]);

const TRANSFER_SYNTAX_UIDS: Record<DicomTransferSyntaxChoice, string> = {
  "explicit-le": EXPLICIT_VR_LITTLE_ENDIAN,
  "implicit-le": IMPLICIT_VR_LITTLE_ENDIAN,
  "explicit-be": EXPLICIT_VR_BIG_ENDIAN,
};

const tagOf = (group: number, element: number): number => ((group << 16) | element) >>> 0;

/**
 * Encodes the image as a DICOM Part 10 file.
 * @returns the file's bytes.
 * @throws Error for inconsistent input (data length ≠ width × height × frames, sizes above 65535, non-finite values,
 *   values that do not fit a given rescale, an attribute the writer owns, invalid UIDs or non-ASCII text).
 */
export function writeDicom(image: DicomWriteImage, options: DicomWriteOptions): Uint8Array {
  const frames = image.frames ?? 1;
  const { width, height } = image;
  for (const [name, v] of [["width", width], ["height", height], ["frames", frames]] as const) {
    if (!(Number.isInteger(v) && v >= 1 && (name === "frames" ? v < 2 ** 31 : v <= 0xffff))) {
      throw new Error(`${name} must be an integer from 1 to ${name === "frames" ? "2³¹−1" : 65535}, got ${v}`);
    }
  }
  if (image.data.length !== width * height * frames) {
    throw new Error(`data has ${image.data.length} values but width × height × frames = ${width * height * frames}`);
  }
  const bitsAllocated = options.bitsAllocated;
  const bitsStored = options.bitsStored ?? bitsAllocated;
  if (!(Number.isInteger(bitsStored) && bitsStored >= 1 && bitsStored <= bitsAllocated)) {
    throw new Error(`bitsStored must be from 1 to bitsAllocated (${bitsAllocated}), got ${bitsStored}`);
  }
  const littleEndian = options.transferSyntax !== "explicit-be";
  const explicitVr = options.transferSyntax !== "implicit-le";
  const photometric = options.photometric ?? "MONOCHROME2";

  const range = storedRange(bitsStored, options.signed);
  const q = quantise(image.data, range, options.rescaleSlope, options.rescaleIntercept);
  if (photometric === "MONOCHROME1") for (let i = 0; i < q.stored.length; i++) q.stored[i] = range.min + range.max - q.stored[i];

  const sopClassUid = checkUid(options.sopClassUid ?? defaultSopClassUid(options.modality, frames, bitsAllocated), "SOP Class UID");
  const sopInstanceUid = checkUid(options.uids?.sopInstanceUid ?? newUid(), "SOP Instance UID");
  const studyUid = checkUid(options.uids?.studyInstanceUid ?? newUid(), "Study Instance UID");
  const seriesUid = checkUid(options.uids?.seriesInstanceUid ?? newUid(), "Series Instance UID");

  const el: EncodedElement[] = [];
  const text = (g: number, e: number, vr: string, value: string) => el.push({ tag: tagOf(g, e), vr, value: textValue(vr, value) });
  const us = (g: number, e: number, value: number) => el.push({ tag: tagOf(g, e), vr: "US", value: uint16Value(value, littleEndian) });

  // Writer-owned attributes and the Type 1/2 attributes of the General Study/Series/Equipment and Patient modules.
  text(0x0008, 0x0016, "UI", sopClassUid);
  text(0x0008, 0x0018, "UI", sopInstanceUid);
  text(0x0008, 0x0060, "CS", options.modality);
  if (sopClassUid.startsWith("1.2.840.10008.5.1.4.1.1.7")) text(0x0008, 0x0064, "CS", "SYN"); // Conversion Type: synthetic
  text(0x0010, 0x0010, "PN", "PHANTOM^HALFMAX");
  text(0x0010, 0x0020, "LO", "PHANTOM");
  text(0x0020, 0x000d, "UI", studyUid);
  text(0x0020, 0x000e, "UI", seriesUid);
  us(0x0028, 0x0002, 1);
  text(0x0028, 0x0004, "CS", photometric);
  if (frames > 1) text(0x0028, 0x0008, "IS", formatIntegerString(frames));
  us(0x0028, 0x0010, height);
  us(0x0028, 0x0011, width);
  if (image.pixelSpacingMm) {
    const spacing = `${formatDecimalString(image.pixelSpacingMm.y)}\\${formatDecimalString(image.pixelSpacingMm.x)}`;
    if (options.useImagerPixelSpacing) text(0x0018, 0x1164, "DS", spacing);
    else text(0x0028, 0x0030, "DS", spacing);
  }
  if (image.sliceSpacingMm != null) text(0x0018, 0x0088, "DS", formatDecimalString(image.sliceSpacingMm));
  us(0x0028, 0x0100, bitsAllocated);
  us(0x0028, 0x0101, bitsStored);
  us(0x0028, 0x0102, bitsStored - 1);
  us(0x0028, 0x0103, options.signed ? 1 : 0);
  if (q.slope !== 1 || q.intercept !== 0 || options.modality === "CT" || options.modality === "PT") {
    text(0x0028, 0x1052, "DS", q.interceptText);
    text(0x0028, 0x1053, "DS", q.slopeText);
  }

  const given = { StudyDate: "", StudyTime: "", ImageType: "DERIVED\\PRIMARY", ...options.attributes };
  for (const [keyword, value] of Object.entries(given)) {
    const def = DICOM_ATTRIBUTES.find((d) => d.keyword === keyword);
    if (!def) throw new Error(`unknown attribute keyword "${keyword}"; known: ${DICOM_ATTRIBUTES.map((d) => d.keyword).join(", ")}`);
    if (WRITER_OWNED.has(keyword)) throw new Error(`attribute ${keyword} is set by the writer from the image and options`);
    const [g, e] = [parseInt(def.tag.slice(1, 5), 16), parseInt(def.tag.slice(5, 9), 16)];
    if (def.kind === "us") us(g, e, Number(value));
    else if (def.kind === "ds" && typeof value === "number") text(g, e, "DS", formatDecimalString(value));
    else if (def.kind === "is" && typeof value === "number") text(g, e, "IS", formatIntegerString(value));
    else text(g, e, def.vr, String(value));
  }

  const pixelVr = bitsAllocated === 8 ? "OB" : "OW";
  el.push({ tag: tagOf(0x7fe0, 0x0010), vr: pixelVr, value: encodePixelCells(q.stored, bitsAllocated, options.signed, littleEndian) });
  const dataSet = encodeElements(el, { explicitVr, littleEndian });

  const metaBody = encodeElements(
    [
      { tag: tagOf(0x0002, 0x0001), vr: "OB", value: new Uint8Array([0, 1]) },
      { tag: tagOf(0x0002, 0x0002), vr: "UI", value: textValue("UI", sopClassUid) },
      { tag: tagOf(0x0002, 0x0003), vr: "UI", value: textValue("UI", sopInstanceUid) },
      { tag: tagOf(0x0002, 0x0010), vr: "UI", value: textValue("UI", TRANSFER_SYNTAX_UIDS[options.transferSyntax]) },
      { tag: tagOf(0x0002, 0x0012), vr: "UI", value: textValue("UI", HALFMAX_IMPLEMENTATION_CLASS_UID) },
      { tag: tagOf(0x0002, 0x0013), vr: "SH", value: textValue("SH", HALFMAX_IMPLEMENTATION_VERSION_NAME) },
    ],
    { explicitVr: true, littleEndian: true },
  );
  const groupLength = encodeElements([{ tag: tagOf(0x0002, 0x0000), vr: "UL", value: uint32Value(metaBody.length, true) }], {
    explicitVr: true,
    littleEndian: true,
  });

  const out = new Uint8Array(132 + groupLength.length + metaBody.length + dataSet.length);
  out.set([0x44, 0x49, 0x43, 0x4d], 128);
  out.set(groupLength, 132);
  out.set(metaBody, 132 + groupLength.length);
  out.set(dataSet, 132 + groupLength.length + metaBody.length);
  return out;
}
