// Phantom image files for upload tests, generated with the project's phantom generators and DICOM writer.
import { PNG } from "pngjs";
// Relative imports (not "@/"), so the Playwright tests in tests/e2e can import this file too.
import { writeDicom } from "../../lib/imaging/dicom-writer";
import { makeGaussianPoint } from "../../lib/phantoms/point";
import { makeSlantedEdge } from "../../lib/phantoms/edge";
import { createRandom } from "../../lib/phantoms/random";

export interface PointDicomOptions {
  sigmaMm?: number;
  pixelSpacingMm?: number;
  size?: number;
  seed?: number;
  serialNumber?: string;
  modality?: string;
  acquisition?: { date: string; time: string };
}

/** A point-source phantom as a DICOM file; a different seed gives different bytes (the duplicate check is per content). */
export function pointSourceDicom(o: PointDicomOptions = {}) {
  const size = o.size ?? 96;
  const spacing = o.pixelSpacingMm ?? 0.25;
  const seed = o.seed ?? Math.floor(Math.random() * 1e9);
  const phantom = makeGaussianPoint({
    width: size, height: size, pixelSpacingMm: spacing, sigmaXMm: o.sigmaMm ?? 0.5,
    centreXPx: size / 2 + ((seed % 100) / 100 - 0.5), centreYPx: size / 2 - 0.3, amplitude: 3000, background: 50, noiseSd: 3, seed,
  });
  const bytes = writeDicom(
    { width: size, height: size, data: phantom.image.data, pixelSpacingMm: phantom.image.pixelSpacingMm },
    {
      transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: o.modality ?? "CT",
      attributes: {
        Manufacturer: "Test Works", ManufacturerModelName: "T-1", DeviceSerialNumber: o.serialNumber ?? "SN-TEST-1",
        AcquisitionDate: o.acquisition?.date ?? "20261115", AcquisitionTime: o.acquisition?.time ?? "093000",
      },
    },
  );
  return { bytes, truth: phantom.truth };
}

export interface JitteredPointOptions {
  /** Default 0.5. */
  pixelSpacingMm?: number;
  /** Default 2000. */
  amplitude?: number;
  /** Default 100. */
  background?: number;
  /** Default 2. */
  noiseSd?: number;
  /** Extra DICOM header attributes (e.g. Manufacturer). */
  attributes?: Record<string, string | number>;
}

/**
 * A 128 × 128 CT point-source DICOM (signed 16-bit) whose seed moves the centre by under a pixel and draws the noise,
 * so each seed gives a new file; by default on 0.5 mm pixels as the alert workflow tests use it.
 */
export function jitteredPointSourceDicom(sigmaMm: number, seed: number, o: JitteredPointOptions = {}): Uint8Array {
  const random = createRandom(seed);
  const phantom = makeGaussianPoint({
    width: 128,
    height: 128,
    pixelSpacingMm: o.pixelSpacingMm ?? 0.5,
    sigmaXMm: sigmaMm,
    centreXPx: 63.5 + random.uniform(),
    centreYPx: 63.5 + random.uniform(),
    amplitude: o.amplitude ?? 2000,
    background: o.background ?? 100,
    noiseSd: o.noiseSd ?? 2,
    seed,
  });
  const { width, height, data, pixelSpacingMm } = phantom.image;
  return writeDicom(
    { width, height, data, pixelSpacingMm },
    { transferSyntax: "explicit-le", bitsAllocated: 16, signed: true, modality: "CT", ...(o.attributes ? { attributes: o.attributes } : {}) },
  );
}

/** A slanted-edge phantom of any size written quickly (point-sampled ESF; enough for timing and plumbing tests). */
export function largeEdgeDicom(size: number) {
  const phantom = makeSlantedEdge({ width: size, height: size, pixelSpacingMm: 0.1, angleDeg: 3, sigmaMm: 0.1, low: 100, high: 1000, noiseSd: 2, seed: 7 });
  return writeDicom({ width: size, height: size, data: phantom.image.data, pixelSpacingMm: phantom.image.pixelSpacingMm }, { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "DX" });
}

/** The same point source as a 16-bit greyscale PNG (which carries no pixel spacing). */
export function pointSourcePng(seed = 11): Uint8Array {
  const size = 96;
  const phantom = makeGaussianPoint({ width: size, height: size, pixelSpacingMm: 0.25, sigmaXMm: 0.5, centreXPx: 48.2, centreYPx: 47.7, amplitude: 3000, background: 50, noiseSd: 3, seed });
  const png = new PNG({ width: size, height: size, colorType: 0, inputColorType: 0, bitDepth: 16, inputHasAlpha: false });
  // pngjs takes 16-bit samples as native-endian 16-bit words (as in tests/imaging/png.test.ts).
  const words = new Uint16Array(size * size);
  for (let i = 0; i < words.length; i++) words[i] = Math.max(0, Math.min(65535, Math.round(phantom.image.data[i]!)));
  png.data = Buffer.from(words.buffer);
  return new Uint8Array(PNG.sync.write(png, { colorType: 0, inputColorType: 0, bitDepth: 16, inputHasAlpha: false }));
}

/** Set an explicit-VR-LE US element (e.g. Rows 0028,0010) to a new value in place. */
export function patchUs(bytes: Uint8Array, group: number, element: number, value: number): Uint8Array {
  const out = bytes.slice();
  for (let i = 132; i < out.length - 10; i++) {
    if (out[i] === (group & 0xff) && out[i + 1] === group >> 8 && out[i + 2] === (element & 0xff) && out[i + 3] === element >> 8 && out[i + 4] === 0x55 && out[i + 5] === 0x53) {
      out[i + 8] = value & 0xff;
      out[i + 9] = value >> 8;
      return out;
    }
  }
  throw new Error(`element (${group.toString(16)},${element.toString(16)}) not found`);
}
