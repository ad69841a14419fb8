/**
 * Independent references computed by Python: pydicom (DICOM parsing and pixel_array), numpy and Pillow (PNG/TIFF
 * writers). Debian's python3-pydicom / python3-numpy / python3-pil live under /usr/bin/python3, which may not be the
 * first python3 on PATH, so that interpreter is tried first.
 */
import { execFileSync } from "node:child_process";

const CANDIDATES = ["/usr/bin/python3", "python3"];
let cached: string | null = null;

/** A python3 that imports pydicom, numpy and PIL. @throws Error with the install hint when there is none. */
export function referencePython(): string {
  if (cached) return cached;
  for (const candidate of CANDIDATES) {
    try {
      execFileSync(candidate, ["-c", "import pydicom, numpy, PIL"], { stdio: "ignore" });
      cached = candidate;
      return candidate;
    } catch {
      // try the next interpreter
    }
  }
  throw new Error("the reference tests need python3 with pydicom, numpy and Pillow: apt-get install python3-pydicom python3-numpy python3-pil");
}

/** Runs a Python script with arguments and parses the JSON it prints on stdout. */
export function runPythonJson<T>(script: string, args: string[] = []): T {
  const out = execFileSync(referencePython(), ["-c", script, ...args], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  return JSON.parse(out) as T;
}

export interface PydicomPixels {
  rows: number;
  columns: number;
  frames: number;
  photometric: string;
  bitsStored: number;
  signed: boolean;
  /** Rescale Slope / Intercept as pydicom reads them (1 / 0 when absent). */
  slope: number;
  intercept: number;
  /** Row spacing, column spacing (PixelSpacing) or null. */
  pixelSpacing: [number, number] | null;
  /** pixel_array passed through pydicom's apply_modality_lut (Rescale Slope/Intercept), flattened frames×rows×cols. */
  rescaled: number[];
  /** pixel_array as stored, flattened. */
  stored: number[];
}

const PYDICOM_PIXELS = `
import sys, json, warnings
warnings.simplefilter("ignore")
import pydicom
from pydicom.pixel_data_handlers.util import apply_modality_lut
out = []
for path in sys.argv[1:]:
    ds = pydicom.dcmread(path)
    arr = ds.pixel_array
    resc = apply_modality_lut(arr, ds)
    ps = ds.get("PixelSpacing")
    out.append({
      "rows": int(ds.Rows), "columns": int(ds.Columns), "frames": int(ds.get("NumberOfFrames", 1) or 1),
      "photometric": str(ds.PhotometricInterpretation), "bitsStored": int(ds.BitsStored),
      "signed": int(ds.PixelRepresentation) == 1,
      "slope": float(ds.get("RescaleSlope", 1)), "intercept": float(ds.get("RescaleIntercept", 0)),
      "pixelSpacing": [float(ps[0]), float(ps[1])] if ps is not None else None,
      "rescaled": [float(v) for v in resc.ravel()], "stored": [int(v) for v in arr.ravel()],
    })
print(json.dumps(out))
`;

/** pydicom's reading of DICOM files, one Python process for all (small files only: every pixel goes through JSON). */
export function pydicomPixels(paths: string[]): PydicomPixels[] {
  return runPythonJson<PydicomPixels[]>(PYDICOM_PIXELS, paths);
}
