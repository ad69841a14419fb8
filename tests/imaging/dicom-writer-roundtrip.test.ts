import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { decodeDicom } from "@/lib/imaging/dicom";
import { writeDicom, type DicomWriteOptions } from "@/lib/imaging/dicom-writer";
import { HALFMAX_IMPLEMENTATION_CLASS_UID } from "@/lib/imaging/dicom-uid";
import { createRandom } from "@/lib/phantoms/random";
import { pydicomPixels, runPythonJson } from "./helpers/python-reference";

const WIDTH = 9; // odd, so 8-bit pixel data needs a padding byte
const HEIGHT = 7;
const FRAMES = 2;
const SPACING = { x: 0.3125, y: 0.75 };

/** Seeded physical values spanning negative and positive numbers (like HU), not integers. */
function sampleValues(seed: number): Float64Array {
  const random = createRandom(seed);
  return Float64Array.from({ length: WIDTH * HEIGHT * FRAMES }, () => -1000 + 3000 * random.uniform());
}

type Case = Pick<DicomWriteOptions, "transferSyntax" | "bitsAllocated" | "signed" | "photometric" | "bitsStored">;
const CASES: Case[] = [];
for (const transferSyntax of ["explicit-le", "implicit-le", "explicit-be"] as const) {
  for (const bitsAllocated of [8, 16, 32] as const) {
    for (const signed of [false, true]) {
      for (const photometric of ["MONOCHROME2", "MONOCHROME1"] as const) CASES.push({ transferSyntax, bitsAllocated, signed, photometric });
    }
  }
  for (const signed of [false, true]) CASES.push({ transferSyntax, bitsAllocated: 16, bitsStored: 12, signed, photometric: "MONOCHROME2" });
}
const label = (c: Case) => `${c.transferSyntax} ${c.bitsAllocated}/${c.bitsStored ?? c.bitsAllocated}-bit ${c.signed ? "signed" : "unsigned"} ${c.photometric}`;

const dir = mkdtempSync(path.join(tmpdir(), "halfmax-dicom-rt-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const values = sampleValues(20240601);
const files = CASES.map((c, i) => {
  const bytes = writeDicom(
    { width: WIDTH, height: HEIGHT, frames: FRAMES, data: values, pixelSpacingMm: SPACING },
    { ...c, modality: "OT", attributes: { Manufacturer: "Halfmax phantoms", KVP: 120, ConvolutionKernel: "B30f" } },
  );
  const file = path.join(dir, `case-${i}.dcm`);
  writeFileSync(file, bytes);
  return { c, bytes, file };
});

describe("writeDicom → decodeDicom round trip", () => {
  it.each(files.map((f) => [label(f.c), f] as const))("%s returns the written values within half a quantisation step and the spacing", (_, f) => {
    const decoded = decodeDicom(f.bytes);
    expect(decoded.width).toBe(WIDTH);
    expect(decoded.height).toBe(HEIGHT);
    expect(decoded.frames).toBe(FRAMES);
    expect(decoded.pixelSpacingMm).toEqual(SPACING);
    expect(decoded.pixelSpacingSource).toBe("PixelSpacing");
    expect(decoded.photometricInterpretation).toBe(f.c.photometric);
    // Quantisation to the nearest stored value errs by at most slope/2 (rounding; common practice).
    const bits = f.c.bitsStored ?? f.c.bitsAllocated;
    const slope = (Math.max(...values) - Math.min(...values)) / (2 ** bits - 1);
    let worst = 0;
    for (let i = 0; i < values.length; i++) worst = Math.max(worst, Math.abs(decoded.data[i] - values[i]));
    expect(worst).toBeLessThanOrEqual(slope / 2 + 1e-9 * 3000);
    expect(decoded.attributes.Manufacturer).toBe("Halfmax phantoms");
    expect(decoded.attributes.KVP).toBe(120);
  });

  it("writeDicom(integers within the stored range) stores them unchanged with identity rescale", () => {
    const data = Float64Array.from({ length: 12 }, (_, i) => i * 1000 - 4000);
    const decoded = decodeDicom(writeDicom({ width: 4, height: 3, data, pixelSpacingMm: { x: 1, y: 1 } }, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: true, modality: "OT" }));
    expect(Array.from(decoded.data)).toEqual(Array.from(data));
    expect(decoded.attributes.RescaleSlope).toBeNull();
  });
});

describe("writeDicom output read by pydicom (independent DICOM implementation)", () => {
  const reference = pydicomPixels(files.map((f) => f.file));

  it.each(files.map((f, i) => [label(f.c), f, i] as const))("%s: pydicom sees the same geometry and values as decodeDicom", (_, f, i) => {
    const ref = reference[i];
    const decoded = decodeDicom(f.bytes);
    expect([ref.rows, ref.columns, ref.frames]).toEqual([HEIGHT, WIDTH, FRAMES]);
    // PS3.3 §10.7.1.3: PixelSpacing = row spacing \ column spacing.
    expect(ref.pixelSpacing).toEqual([SPACING.y, SPACING.x]);
    expect(ref.bitsStored).toBe(f.c.bitsStored ?? f.c.bitsAllocated);
    expect(ref.signed).toBe(f.c.signed);
    const bits = ref.bitsStored;
    const [min, max] = ref.signed ? [-(2 ** (bits - 1)), 2 ** (bits - 1) - 1] : [0, 2 ** bits - 1];
    for (let k = 0; k < ref.rescaled.length; k++) {
      // MONOCHROME1 → bright-is-high convention of decodeDicom: R(min) + R(max) − R(stored), R = modality LUT.
      const expected = ref.photometric === "MONOCHROME1"
        ? ref.slope * min + ref.intercept + ref.slope * max + ref.intercept - ref.rescaled[k]
        : ref.rescaled[k];
      expect(Math.abs(decoded.data[k] - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)));
    }
  });

  it("writeDicom meta header: pydicom reads our Implementation Class UID, the transfer syntax and a correct group length", () => {
    const meta = runPythonJson<{ impl: string; ts: string; mediaSop: string; sop: string; groupLength: number; metaEnd: number }[]>(
      `
import sys, json, pydicom
from pydicom.filereader import read_preamble, _read_file_meta_info
out = []
for p in sys.argv[1:]:
    ds = pydicom.dcmread(p)
    with open(p, "rb") as fp:
        read_preamble(fp, False)
        fm = _read_file_meta_info(fp)  # reads group 0002 elements until the group ends, ignoring the group length
        end = fp.tell()
    out.append({"impl": fm.ImplementationClassUID, "ts": fm.TransferSyntaxUID, "mediaSop": fm.MediaStorageSOPInstanceUID,
                "sop": ds.SOPInstanceUID, "groupLength": int(fm.FileMetaInformationGroupLength), "metaEnd": end})
print(json.dumps(out))
`,
      [files[0].file, files[14].file, files[28].file],
    );
    const tsUids = ["1.2.840.10008.1.2.1", "1.2.840.10008.1.2", "1.2.840.10008.1.2.2"]; // PS3.6 Annex A
    meta.forEach((m, i) => {
      expect(m.impl).toBe(HALFMAX_IMPLEMENTATION_CLASS_UID);
      expect(m.ts).toBe(tsUids[i]);
      expect(m.mediaSop).toBe(m.sop);
      // PS3.10 §7.1: the group length counts the bytes after the (0002,0000) element (12 bytes, after 128 + 4).
      expect(m.groupLength).toBe(m.metaEnd - 132 - 12);
    });
  });
});

describe("writeDicom(invalid input) throws instead of writing a wrong file", () => {
  const ok = { width: 2, height: 2, data: [1, 2, 3, 4], pixelSpacingMm: { x: 1, y: 1 } };
  const options = { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT" } as const;

  it("writeDicom(data length ≠ width × height × frames) names both counts", () => {
    expect(() => writeDicom({ ...ok, data: [1, 2, 3] }, options)).toThrow(/3 values .* 4/);
  });

  it("writeDicom(values outside a given rescale's stored range) refuses to clip", () => {
    expect(() => writeDicom({ ...ok, data: [0, 1, 2, 70000] }, { ...options, rescaleSlope: 1, rescaleIntercept: 0 })).toThrow(/outside 0…65535/);
  });

  it("writeDicom(NaN value, writer-owned or unknown attribute, non-ASCII text) throws", () => {
    expect(() => writeDicom({ ...ok, data: [1, Number.NaN, 3, 4] }, options)).toThrow(/not a finite number/);
    expect(() => writeDicom(ok, { ...options, attributes: { PixelSpacing: "1\\1" } })).toThrow(/set by the writer/);
    expect(() => writeDicom(ok, { ...options, attributes: { PatientsFavouriteColour: "red" } })).toThrow(/unknown attribute/);
    expect(() => writeDicom(ok, { ...options, attributes: { Manufacturer: "Größe" } })).toThrow(/printable ASCII/);
  });

  it("writeDicom(width 70000) throws: Rows/Columns are 16-bit (PS3.3 C.7.6.3)", () => {
    expect(() => writeDicom({ ...ok, width: 70000, height: 1, data: new Float64Array(70000) }, options)).toThrow(/65535/);
  });
});
