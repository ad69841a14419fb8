import { describe, expect, it } from "vitest";
import { sniffDicomLayout, sniffImageFormat } from "@/lib/imaging/sniff";
import { writeDicom } from "@/lib/imaging/dicom-writer";
import { createRandom } from "@/lib/phantoms/random";

const dicom = writeDicom({ width: 2, height: 2, data: [1, 2, 3, 4], pixelSpacingMm: null }, { transferSyntax: "explicit-le", bitsAllocated: 8, signed: false, modality: "OT" });
const bytes = (...b: number[]) => new Uint8Array([...b, ...new Array(32).fill(0)]);

describe("sniffImageFormat(bytes)", () => {
  it("sniffImageFormat(Part 10 file) is dicom: 'DICM' at byte 128 (PS3.10 §7.1)", () => {
    expect(sniffImageFormat(dicom)).toBe("dicom");
    expect(sniffDicomLayout(dicom)).toEqual({ kind: "part10" });
  });

  it("sniffImageFormat(PNG signature 89 50 4E 47 0D 0A 1A 0A) is png (PNG spec §5.2)", () => {
    expect(sniffImageFormat(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a))).toBe("png");
  });

  it("sniffImageFormat('II*\\0' and 'MM\\0*') is tiff (TIFF 6.0 §2)", () => {
    expect(sniffImageFormat(bytes(0x49, 0x49, 0x2a, 0x00, 8, 0, 0, 0))).toBe("tiff");
    expect(sniffImageFormat(bytes(0x4d, 0x4d, 0x00, 0x2a, 0, 0, 0, 8))).toBe("tiff");
  });

  it("sniffImageFormat(DICOM whose preamble holds a TIFF header) is dicom (PS3.10 §7.5 dual-format files)", () => {
    const dual = dicom.slice();
    dual.set([0x49, 0x49, 0x2a, 0x00], 0);
    expect(sniffImageFormat(dual)).toBe("dicom");
  });

  it("sniffDicomLayout(preamble-less forms) recognises meta without preamble and bare data sets", () => {
    expect(sniffDicomLayout(dicom.subarray(132))).toEqual({ kind: "meta-without-preamble" });
    // (0008,0016) UI in Explicit VR LE, Implicit VR LE (32-bit length) and Explicit VR BE.
    expect(sniffDicomLayout(bytes(0x08, 0x00, 0x16, 0x00, 0x55, 0x49, 0x04, 0x00))).toEqual({ kind: "dataset-without-meta", transferSyntaxUid: "1.2.840.10008.1.2.1" });
    expect(sniffDicomLayout(bytes(0x08, 0x00, 0x16, 0x00, 0x04, 0x00, 0x00, 0x00))).toEqual({ kind: "dataset-without-meta", transferSyntaxUid: "1.2.840.10008.1.2" });
    expect(sniffDicomLayout(bytes(0x00, 0x08, 0x00, 0x16, 0x55, 0x49, 0x00, 0x04))).toEqual({ kind: "dataset-without-meta", transferSyntaxUid: "1.2.840.10008.1.2.2" });
  });

  it("sniffImageFormat(empty, short, JPEG, text and seeded random bytes) is null — never guessed from a name", () => {
    expect(sniffImageFormat(new Uint8Array(0))).toBeNull();
    expect(sniffImageFormat(new Uint8Array([0x89, 0x50]))).toBeNull();
    expect(sniffImageFormat(bytes(0xff, 0xd8, 0xff, 0xe0))).toBeNull();
    expect(sniffImageFormat(new TextEncoder().encode("name: scan.dcm\nnot an image at all\n".repeat(10)))).toBeNull();
    const random = createRandom(3);
    for (let t = 0; t < 50; t++) {
      const r = Uint8Array.from({ length: 300 }, () => Math.floor(256 * random.uniform()));
      r[0] = 0x10; // keep away from the accepted first bytes (0x08, 0x02, 0x00, 0x49, 0x4D, 0x89)
      expect(sniffImageFormat(r)).toBeNull();
    }
  });
});
