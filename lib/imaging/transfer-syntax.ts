/**
 * DICOM transfer syntaxes (PS3.5 §10 and Annex A; UIDs from PS3.6 Annex A) and what Halfmax does with each.
 *
 * - "native": uncompressed, read directly (Implicit/Explicit VR Little Endian, Explicit VR Big Endian).
 * - "jpeg-lossless": JPEG Lossless process 14 (ITU-T T.81 Annex H), decoded with jpeg-lossless-decoder-js.
 * - "unsupported-lossless": lossless, but not decoded here: RLE, JPEG-LS, JPEG 2000 lossless, HTJ2K lossless (no
 *   well-known decoder package), and Deflated Explicit VR Little Endian — refused rather than inflated, because
 *   the inflated size is unknown until it is done (a small upload could expand to gigabytes before any pixel limit
 *   applies) and lib/imaging does not use node: modules.
 * - "lossy": lossy (or possibly lossy) compression — rejected with a message that it alters the MTF and noise.
 */
import { ImageDecodeError } from "./image-decode-error";

export type TransferSyntaxKind = "native" | "jpeg-lossless" | "unsupported-lossless" | "lossy";

export interface TransferSyntaxInfo {
  uid: string;
  name: string;
  kind: TransferSyntaxKind;
  littleEndian: boolean;
}

const TS = (uid: string, name: string, kind: TransferSyntaxKind, littleEndian = true): TransferSyntaxInfo => ({
  uid,
  name,
  kind,
  littleEndian,
});

const P = "1.2.840.10008.1.2";

export const TRANSFER_SYNTAXES: readonly TransferSyntaxInfo[] = [
  TS(P, "Implicit VR Little Endian", "native"),
  TS(`${P}.1`, "Explicit VR Little Endian", "native"),
  TS(`${P}.1.99`, "Deflated Explicit VR Little Endian", "unsupported-lossless"),
  TS(`${P}.2`, "Explicit VR Big Endian", "native", false),
  TS(`${P}.1.98`, "Encapsulated Uncompressed Explicit VR Little Endian", "unsupported-lossless"),
  TS(`${P}.4.50`, "JPEG Baseline (Process 1)", "lossy"),
  TS(`${P}.4.51`, "JPEG Extended (Process 2 & 4)", "lossy"),
  TS(`${P}.4.57`, "JPEG Lossless, Non-Hierarchical (Process 14)", "jpeg-lossless"),
  TS(`${P}.4.70`, "JPEG Lossless, Non-Hierarchical, First-Order Prediction (Process 14, Selection Value 1)", "jpeg-lossless"),
  TS(`${P}.4.80`, "JPEG-LS Lossless", "unsupported-lossless"),
  TS(`${P}.4.81`, "JPEG-LS Lossy (Near-Lossless)", "lossy"),
  TS(`${P}.4.90`, "JPEG 2000 (Lossless Only)", "unsupported-lossless"),
  TS(`${P}.4.91`, "JPEG 2000 (lossless or lossy)", "lossy"),
  TS(`${P}.4.92`, "JPEG 2000 Part 2 Multi-component (Lossless Only)", "unsupported-lossless"),
  TS(`${P}.4.93`, "JPEG 2000 Part 2 Multi-component (lossless or lossy)", "lossy"),
  TS(`${P}.4.94`, "JPIP Referenced", "unsupported-lossless"),
  TS(`${P}.4.95`, "JPIP Referenced Deflate", "unsupported-lossless"),
  TS(`${P}.4.100`, "MPEG2 Main Profile / Main Level", "lossy"),
  TS(`${P}.4.101`, "MPEG2 Main Profile / High Level", "lossy"),
  TS(`${P}.4.102`, "MPEG-4 AVC/H.264 High Profile / Level 4.1", "lossy"),
  TS(`${P}.4.103`, "MPEG-4 AVC/H.264 BD-compatible High Profile / Level 4.1", "lossy"),
  TS(`${P}.4.104`, "MPEG-4 AVC/H.264 High Profile / Level 4.2 for 2D Video", "lossy"),
  TS(`${P}.4.105`, "MPEG-4 AVC/H.264 High Profile / Level 4.2 for 3D Video", "lossy"),
  TS(`${P}.4.106`, "MPEG-4 AVC/H.264 Stereo High Profile / Level 4.2", "lossy"),
  TS(`${P}.4.107`, "HEVC/H.265 Main Profile / Level 5.1", "lossy"),
  TS(`${P}.4.108`, "HEVC/H.265 Main 10 Profile / Level 5.1", "lossy"),
  TS(`${P}.4.201`, "High-Throughput JPEG 2000 (Lossless Only)", "unsupported-lossless"),
  TS(`${P}.4.202`, "High-Throughput JPEG 2000 with RPCL Options (Lossless Only)", "unsupported-lossless"),
  TS(`${P}.4.203`, "High-Throughput JPEG 2000 (lossless or lossy)", "lossy"),
  TS(`${P}.4.204`, "JPIP HTJ2K Referenced", "unsupported-lossless"),
  TS(`${P}.5`, "RLE Lossless", "unsupported-lossless"),
];

const BY_UID = new Map(TRANSFER_SYNTAXES.map((ts) => [ts.uid, ts]));

/** Known transfer syntax by UID, or null. Retired JPEG processes (…4.52–4.66 except 4.57) are not listed. */
export function findTransferSyntax(uid: string): TransferSyntaxInfo | null {
  return BY_UID.get(uid) ?? null;
}

const EXPORT_ADVICE = "export the image uncompressed (Explicit VR Little Endian) from the scanner or PACS and upload it again";

/**
 * The transfer syntax's description if Halfmax can read it.
 * @throws ImageDecodeError "unsupported_transfer_syntax" naming the syntax (name and UID); lossy syntaxes get a
 *   message explaining that lossy compression alters the MTF.
 */
export function requireReadableTransferSyntax(uid: string): TransferSyntaxInfo {
  const ts = findTransferSyntax(uid);
  if (!ts) {
    throw new ImageDecodeError(
      "unsupported_transfer_syntax",
      `unknown or retired transfer syntax ${uid || "(empty)"} is not supported; ${EXPORT_ADVICE}`,
    );
  }
  if (ts.kind === "lossy") {
    throw new ImageDecodeError(
      "unsupported_transfer_syntax",
      `transfer syntax ${ts.name} (${ts.uid}) is lossy compression, which alters the MTF and the noise, so the image ` +
        `is not fit for resolution QA; ${EXPORT_ADVICE}, without lossy compression`,
    );
  }
  if (ts.kind === "unsupported-lossless") {
    throw new ImageDecodeError(
      "unsupported_transfer_syntax",
      `transfer syntax ${ts.name} (${ts.uid}) is not supported; ${EXPORT_ADVICE}`,
    );
  }
  return ts;
}
