import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { decodeDicom } from "@/lib/imaging/dicom";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { createRandom } from "@/lib/phantoms/random";
import { buildEncapsulatedDicom } from "./helpers/encapsulated-dicom";
import { encodeJpegLossless } from "./helpers/jpeg-lossless-encoder";
import { runPythonJson } from "./helpers/python-reference";

const SV1 = "1.2.840.10008.1.2.4.70"; // JPEG Lossless, First-Order Prediction (PS3.6 Annex A)
const PROCESS14 = "1.2.840.10008.1.2.4.57";

/** A seeded test pattern: a bright blob plus noise, as unsigned values < 2^bits. */
function pattern(width: number, height: number, bits: number, seed: number): number[] {
  const random = createRandom(seed);
  const top = 2 ** bits - 1;
  return Array.from({ length: width * height }, (_, i) => {
    const x = i % width;
    const y = Math.floor(i / width);
    const blob = Math.exp(-((x - width / 3) ** 2 + (y - height / 2) ** 2) / 20);
    return Math.min(top, Math.max(0, Math.round(0.1 * top + 0.8 * top * blob + 0.02 * top * random.normal())));
  });
}

const dir = mkdtempSync(path.join(tmpdir(), "halfmax-jpegll-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("decodeDicom(JPEG Lossless pixel data encoded per ITU-T T.81 Annex H)", () => {
  it("decodeDicom(16-bit, 12 stored, SV1) returns exactly the encoded samples", () => {
    const samples = pattern(37, 23, 12, 11);
    const bytes = buildEncapsulatedDicom({
      width: 37, height: 23, frames: 1, bitsAllocated: 16, bitsStored: 12, signed: false,
      transferSyntaxUid: SV1, frameFragments: [[encodeJpegLossless(samples, 37, 23, 12)]], basicOffsetTable: false,
    });
    const decoded = decodeDicom(bytes);
    expect(decoded.transferSyntaxUid).toBe(SV1);
    expect(Array.from(decoded.data)).toEqual(samples);
  });

  it("decodeDicom(8-bit, process 14 UID …4.57) returns exactly the encoded samples", () => {
    const samples = pattern(16, 9, 8, 12);
    const bytes = buildEncapsulatedDicom({
      width: 16, height: 9, frames: 1, bitsAllocated: 8, bitsStored: 8, signed: false,
      transferSyntaxUid: PROCESS14, frameFragments: [[encodeJpegLossless(samples, 16, 9, 8)]], basicOffsetTable: false,
    });
    expect(Array.from(decodeDicom(bytes).data)).toEqual(samples);
  });

  it("decodeDicom(signed 16-bit JPEG Lossless) sign-extends the two's-complement bit patterns", () => {
    // Signed data are coded as their 16-bit two's-complement patterns (PS3.5 §8.2.1).
    const values = pattern(20, 10, 12, 13).map((v) => v - 3000);
    const patterns = values.map((v) => v & 0xffff);
    const bytes = buildEncapsulatedDicom({
      width: 20, height: 10, frames: 1, bitsAllocated: 16, bitsStored: 16, signed: true,
      transferSyntaxUid: SV1, frameFragments: [[encodeJpegLossless(patterns, 20, 10, 16)]], basicOffsetTable: false,
    });
    expect(Array.from(decodeDicom(bytes).data)).toEqual(values);
  });

  const frames = [0, 1, 2].map((f) => pattern(12, 8, 10, 20 + f));
  const streams = frames.map((s) => encodeJpegLossless(s, 12, 8, 10));
  const layouts = [
    { name: "one fragment per frame, empty offset table", frameFragments: streams.map((s) => [s]), basicOffsetTable: false },
    { name: "one fragment per frame, with offset table", frameFragments: streams.map((s) => [s]), basicOffsetTable: true },
    {
      name: "frames split over two fragments, with offset table",
      frameFragments: streams.map((s) => [s.subarray(0, 40), s.subarray(40)]),
      basicOffsetTable: true,
    },
  ];

  it.each(layouts.map((l) => [l.name, l] as const))("decodeDicom(3-frame JPEG Lossless, %s) returns every frame in order", (_, layout) => {
    const bytes = buildEncapsulatedDicom({
      width: 12, height: 8, frames: 3, bitsAllocated: 16, bitsStored: 10, signed: false,
      transferSyntaxUid: SV1, frameFragments: layout.frameFragments, basicOffsetTable: layout.basicOffsetTable,
    });
    const decoded = decodeDicom(bytes);
    expect(decoded.frames).toBe(3);
    expect(Array.from(decoded.data)).toEqual(frames.flat());
  });

  it("buildEncapsulatedDicom output is standard: pydicom finds the same JPEG frames in it", () => {
    const bytes = buildEncapsulatedDicom({
      width: 12, height: 8, frames: 3, bitsAllocated: 16, bitsStored: 10, signed: false,
      transferSyntaxUid: SV1, frameFragments: streams.map((s) => [s]), basicOffsetTable: true,
    });
    const file = path.join(dir, "sv1-3frames.dcm");
    writeFileSync(file, bytes);
    const ref = runPythonJson<{ ts: string; frames: string[] }>(
      `
import sys, json, pydicom
from pydicom.encaps import generate_pixel_data_frame
ds = pydicom.dcmread(sys.argv[1])
frames = [f.hex() for f in generate_pixel_data_frame(ds.PixelData, int(ds.NumberOfFrames))]
print(json.dumps({"ts": ds.file_meta.TransferSyntaxUID, "frames": frames}))
`,
      [file],
    );
    expect(ref.ts).toBe(SV1);
    expect(ref.frames).toEqual(streams.map((s) => Buffer.from(s.length % 2 ? [...s, 0] : s).toString("hex")));
  });

  it("decodeDicom(JPEG frame whose size differs from Rows/Columns) throws size_mismatch", () => {
    const samples = pattern(10, 10, 12, 14);
    const bytes = buildEncapsulatedDicom({
      width: 12, height: 10, frames: 1, bitsAllocated: 16, bitsStored: 12, signed: false,
      transferSyntaxUid: SV1, frameFragments: [[encodeJpegLossless(samples, 10, 10, 12)]], basicOffsetTable: false,
    });
    expect(() => decodeDicom(bytes)).toThrowError(expect.objectContaining({ code: "size_mismatch" }));
  });

  it.each([0.1, 0.5, 0.9, 0.99])("decodeDicom(JPEG stream cut to %s of its length) throws truncated instead of returning zeros", (fraction) => {
    const samples = pattern(32, 32, 12, 15);
    const stream = encodeJpegLossless(samples, 32, 32, 12);
    const bytes = buildEncapsulatedDicom({
      width: 32, height: 32, frames: 1, bitsAllocated: 16, bitsStored: 12, signed: false,
      transferSyntaxUid: SV1, frameFragments: [[stream.subarray(0, Math.floor(stream.length * fraction))]], basicOffsetTable: false,
    });
    let error: unknown;
    try {
      decodeDicom(bytes);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImageDecodeError);
    expect((error as ImageDecodeError).code).toBe("truncated");
  });
});
