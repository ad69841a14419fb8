/**
 * Pixel Data encoding and SOP Class choice for the DICOM writer.
 */

/** SOP Class UIDs (PS3.4 Annex B.5). */
export const SOP_CLASS = {
  computedRadiography: "1.2.840.10008.5.1.4.1.1.1",
  digitalXRayForProcessing: "1.2.840.10008.5.1.4.1.1.1.1.1",
  digitalMammographyForProcessing: "1.2.840.10008.5.1.4.1.1.1.2.1",
  ct: "1.2.840.10008.5.1.4.1.1.2",
  mr: "1.2.840.10008.5.1.4.1.1.4",
  nuclearMedicine: "1.2.840.10008.5.1.4.1.1.20",
  pet: "1.2.840.10008.5.1.4.1.1.128",
  secondaryCapture: "1.2.840.10008.5.1.4.1.1.7",
  multiFrameGrayscaleByteSecondaryCapture: "1.2.840.10008.5.1.4.1.1.7.2",
  multiFrameGrayscaleWordSecondaryCapture: "1.2.840.10008.5.1.4.1.1.7.3",
} as const;

/**
 * Default SOP Class for a phantom image: the modality's own single-frame storage class (CR, DX and MG "for
 * processing", CT, MR, PET, NM), NM Image Storage for multi-frame NM, otherwise Secondary Capture — the multi-frame
 * greyscale byte/word variant for several frames (word also for 32-bit data, which no SC class defines).
 */
export function defaultSopClassUid(modality: string, frames: number, bitsAllocated: number): string {
  if (frames > 1) {
    if (modality === "NM") return SOP_CLASS.nuclearMedicine;
    return bitsAllocated === 8 ? SOP_CLASS.multiFrameGrayscaleByteSecondaryCapture : SOP_CLASS.multiFrameGrayscaleWordSecondaryCapture;
  }
  switch (modality) {
    case "CR":
      return SOP_CLASS.computedRadiography;
    case "DX":
      return SOP_CLASS.digitalXRayForProcessing;
    case "MG":
      return SOP_CLASS.digitalMammographyForProcessing;
    case "CT":
      return SOP_CLASS.ct;
    case "MR":
      return SOP_CLASS.mr;
    case "PT":
      return SOP_CLASS.pet;
    case "NM":
      return SOP_CLASS.nuclearMedicine;
    default:
      return SOP_CLASS.secondaryCapture;
  }
}

/**
 * Stored integer values as pixel cells of `bitsAllocated` bits in the transfer syntax's byte order (two's complement
 * when signed, so values stored in fewer bits are sign-extended through the cell).
 */
export function encodePixelCells(stored: Float64Array, bitsAllocated: 8 | 16 | 32, signed: boolean, littleEndian: boolean): Uint8Array {
  const bytes = bitsAllocated >> 3;
  const out = new Uint8Array(stored.length * bytes);
  const view = new DataView(out.buffer);
  const n = stored.length;
  if (bitsAllocated === 8) {
    for (let i = 0; i < n; i++) out[i] = stored[i] & 0xff;
  } else if (bitsAllocated === 16) {
    if (signed) for (let i = 0; i < n; i++) view.setInt16(i * 2, stored[i], littleEndian);
    else for (let i = 0; i < n; i++) view.setUint16(i * 2, stored[i], littleEndian);
  } else if (signed) {
    for (let i = 0; i < n; i++) view.setInt32(i * 4, stored[i], littleEndian);
  } else {
    for (let i = 0; i < n; i++) view.setUint32(i * 4, stored[i], littleEndian);
  }
  return out;
}
