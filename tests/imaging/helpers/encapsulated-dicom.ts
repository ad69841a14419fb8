/**
 * Builds a DICOM Part 10 file with encapsulated (compressed) Pixel Data, PS3.5 §A.4: Pixel Data (7FE0,0010) OB of
 * undefined length, a Basic Offset Table item, one item per fragment (each padded to even length), and a Sequence
 * Delimitation Item. The header comes from writeDicom (validated against pydicom in dicom-writer-roundtrip.test.ts);
 * only the transfer syntax and the Pixel Data element are replaced.
 */
import { writeDicom } from "@/lib/imaging/dicom-writer";

export interface EncapsulatedOptions {
  width: number;
  height: number;
  frames: number;
  bitsAllocated: 8 | 16;
  bitsStored: number;
  signed: boolean;
  transferSyntaxUid: string;
  /** Fragments of each frame. */
  frameFragments: Uint8Array[][];
  basicOffsetTable: boolean;
}

function tagBytes(group: number, element: number, view: DataView, at: number): void {
  view.setUint16(at, group, true);
  view.setUint16(at + 2, element, true);
}

export function buildEncapsulatedDicom(o: EncapsulatedOptions): Uint8Array {
  // A native file with a 1-pixel placeholder carries every header attribute; its meta and Pixel Data are rewritten.
  const header = writeDicom(
    { width: o.width, height: o.height, frames: o.frames, data: new Float64Array(o.width * o.height * o.frames), pixelSpacingMm: { x: 0.5, y: 0.5 } },
    { transferSyntax: "explicit-le", bitsAllocated: o.bitsAllocated, bitsStored: o.bitsStored, signed: o.signed, modality: "OT", rescaleSlope: 1, rescaleIntercept: 0 },
  );
  const nativeBytes = o.width * o.height * o.frames * (o.bitsAllocated / 8);
  const pixelHeader = 12;
  const beforePixel = header.subarray(0, header.length - nativeBytes - (nativeBytes % 2) - pixelHeader);
  // Rewrite the Transfer Syntax UID (0002,0010): rebuild the meta group from pydicom-checked writer output.
  const text = new TextDecoder("latin1").decode(beforePixel);
  const oldTs = "1.2.840.10008.1.2.1\0";
  const at = text.indexOf(oldTs);
  if (at < 0) throw new Error("transfer syntax not found in writer output");
  const newTs = o.transferSyntaxUid.length % 2 === 1 ? `${o.transferSyntaxUid}\0` : o.transferSyntaxUid;
  const delta = newTs.length - oldTs.length;
  const head = new Uint8Array(beforePixel.length + delta);
  head.set(beforePixel.subarray(0, at - 2));
  const view = new DataView(head.buffer);
  view.setUint16(at - 2, newTs.length, true); // the UI element's 2-byte length
  for (let i = 0; i < newTs.length; i++) head[at + i] = newTs.charCodeAt(i);
  head.set(beforePixel.subarray(at + oldTs.length), at + newTs.length);
  view.setUint32(140, view.getUint32(140, true) + delta, true); // (0002,0000) group length value at byte 140

  const fragments = o.frameFragments.flat().map((f) => (f.length % 2 === 1 ? Uint8Array.from([...f, 0]) : f));
  const offsets: number[] = [];
  let position = 0;
  for (const frame of o.frameFragments) {
    offsets.push(position);
    for (const f of frame) position += 8 + f.length + (f.length % 2);
  }
  const botLength = o.basicOffsetTable ? 4 * o.frames : 0;
  const total = 12 + 8 + botLength + fragments.reduce((s, f) => s + 8 + f.length, 0) + 8;
  const pixel = new Uint8Array(total);
  const pv = new DataView(pixel.buffer);
  tagBytes(0x7fe0, 0x0010, pv, 0);
  pixel[4] = 0x4f; // "O"
  pixel[5] = 0x42; // "B"
  pv.setUint32(8, 0xffffffff, true); // undefined length
  let p = 12;
  tagBytes(0xfffe, 0xe000, pv, p);
  pv.setUint32(p + 4, botLength, true);
  p += 8;
  if (o.basicOffsetTable) for (const off of offsets) { pv.setUint32(p, off, true); p += 4; }
  for (const f of fragments) {
    tagBytes(0xfffe, 0xe000, pv, p);
    pv.setUint32(p + 4, f.length, true);
    pixel.set(f, p + 8);
    p += 8 + f.length;
  }
  tagBytes(0xfffe, 0xe0dd, pv, p);
  pv.setUint32(p + 4, 0, true);

  const out = new Uint8Array(head.length + pixel.length);
  out.set(head);
  out.set(pixel, head.length);
  return out;
}
