import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { decodeDicom } from "@/lib/imaging/dicom";
import { writeDicom } from "@/lib/imaging/dicom-writer";
import { runPythonJson } from "./helpers/python-reference";

const dir = mkdtempSync(path.join(tmpdir(), "halfmax-fg-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// pydicom rewrites a 3-frame file as an enhanced-style object (PS3.3 C.7.6.16): spacing only in the Shared
// Functional Groups' Pixel Measures, a different Rescale Slope/Intercept per frame in the Per-frame Functional
// Groups' Pixel Value Transformation; it also computes the expected values with numpy.
const MAKE_ENHANCED = `
import sys, json, numpy as np, pydicom
from pydicom.dataset import Dataset
from pydicom.sequence import Sequence
src, dst, syntax = sys.argv[1], sys.argv[2], sys.argv[3]
ds = pydicom.dcmread(src)
for kw in ("PixelSpacing", "RescaleSlope", "RescaleIntercept"):
    if kw in ds: delattr(ds, kw)
measures = Dataset(); measures.PixelSpacing = [0.4, 0.3]; measures.SliceThickness = 1.25; measures.SpacingBetweenSlices = 1.5
shared = Dataset(); shared.PixelMeasuresSequence = Sequence([measures])
ds.SharedFunctionalGroupsSequence = Sequence([shared])
frames = []
for f in range(int(ds.NumberOfFrames)):
    t = Dataset(); t.RescaleSlope = f + 1; t.RescaleIntercept = -100 * f; t.RescaleType = "US"
    item = Dataset(); item.PixelValueTransformationSequence = Sequence([t])
    frames.append(item)
ds.PerFrameFunctionalGroupsSequence = Sequence(frames)
if syntax == "implicit":
    ds.file_meta.TransferSyntaxUID = pydicom.uid.ImplicitVRLittleEndian
    ds.is_implicit_VR = True
ds.save_as(dst, write_like_original=False)
arr = pydicom.dcmread(dst).pixel_array.astype(float)
expected = np.stack([arr[f] * (f + 1) - 100 * f for f in range(arr.shape[0])])
print(json.dumps([float(v) for v in expected.ravel()]))
`;

describe("decodeDicom(enhanced multi-frame functional groups)", () => {
  const width = 6;
  const height = 5;
  const data = Float64Array.from({ length: width * height * 3 }, (_, i) => (i * 37) % 1000);
  const source = path.join(dir, "source.dcm");
  writeFileSync(source, writeDicom({ width, height, frames: 3, data, pixelSpacingMm: { x: 1, y: 1 } }, {
    transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT",
  }));

  it.each(["explicit", "implicit"])("decodeDicom(%s VR) applies per-frame rescale and shared Pixel Measures like pydicom + numpy", (syntax) => {
    const target = path.join(dir, `enhanced-${syntax}.dcm`);
    const expected = runPythonJson<number[]>(MAKE_ENHANCED, [source, target, syntax]);
    const decoded = decodeDicom(new Uint8Array(readFileSync(target)));
    expect(Array.from(decoded.data)).toEqual(expected);
    // Pixel Spacing "0.4\0.3" = row spacing \ column spacing (PS3.3 §10.7.1.3).
    expect(decoded.pixelSpacingMm).toEqual({ x: 0.3, y: 0.4 });
    expect(decoded.sliceSpacingMm).toBe(1.5);
  });
});
