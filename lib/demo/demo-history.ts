/**
 * Synthetic weekly phantom scans for the fictional demo fleet: each week's image is generated from a resolution that
 * varies a little from week to week (and, for two scanners, drifts), written as a DICOM file, and later analysed by
 * the real pipeline. Invented data, for the demo only.
 */
import type { PixelSpacingMm } from "../analysis/types";
import { writeDicom } from "../imaging/dicom-writer";
import { makeDisk } from "../phantoms/disk";
import { makeSlantedEdge } from "../phantoms/edge";
import { makeGaussianLine } from "../phantoms/line";
import { makeGaussianPoint } from "../phantoms/point";
import { createRandom } from "../phantoms/random";

export type DemoMethod = "point" | "line" | "edge" | "disk";

export interface DemoScannerProfile {
  key: string;
  method: DemoMethod;
  modality: string;
  /** Resolution of the healthy scanner: σ of the Gaussian spread function, mm. */
  sigmaMm: number;
  pixelSpacingMm: number;
  sizePx: number;
  /** Relative week-to-week scatter of σ (1 SD). */
  scatter: number;
  /** Multiplier of σ by week index (drift scenarios); 1 = healthy. */
  sigmaFactor?: (week: number, weeks: number) => number;
  /** Weeks without a test (e.g. camera out of use), counted back from the newest week. */
  skipLastWeeks?: number;
  attributes: Record<string, string | number>;
}

/** The weekly test of the drift scenario: DR Room 1 degrades into the action level, is serviced and recovers. */
export const DR_SERVICE_WEEK = 38;

const degradeThenRecover = (week: number) => (week < 30 ? 1 : week < DR_SERVICE_WEEK ? 1 + 0.07 * (week - 29) : 1);
const slowRecentDrift = (week: number, weeks: number) => (week < weeks - 7 ? 1 : 1 + 0.025 * (week - (weeks - 8)));

export const DEMO_PROFILES: DemoScannerProfile[] = [
  { key: "ct1", method: "disk", modality: "CT", sigmaMm: 0.45, pixelSpacingMm: 0.5, sizePx: 128, scatter: 0.02, attributes: { ConvolutionKernel: "STD-B", KVP: 120, SliceThickness: 2.5 } },
  { key: "ct2", method: "point", modality: "CT", sigmaMm: 0.3, pixelSpacingMm: 0.15, sizePx: 96, scatter: 0.02, attributes: { ConvolutionKernel: "SHARP-H", KVP: 120, SliceThickness: 1 } },
  { key: "pet", method: "point", modality: "PT", sigmaMm: 2.1, pixelSpacingMm: 1, sizePx: 64, scatter: 0.02, attributes: { SliceThickness: 2 } },
  { key: "gc", method: "line", modality: "NM", sigmaMm: 3.2, pixelSpacingMm: 1.2, sizePx: 96, scatter: 0.02, skipLastWeeks: 4, attributes: {} },
  { key: "dr", method: "edge", modality: "DX", sigmaMm: 0.08, pixelSpacingMm: 0.15, sizePx: 160, scatter: 0.02, sigmaFactor: degradeThenRecover, attributes: { KVP: 70 } },
  { key: "mg", method: "edge", modality: "MG", sigmaMm: 0.035, pixelSpacingMm: 0.07, sizePx: 160, scatter: 0.015, sigmaFactor: slowRecentDrift, attributes: { KVP: 28 } },
];

export interface DemoScan {
  week: number;
  acquiredAt: Date;
  fileName: string;
  bytes: Uint8Array;
  sigmaMm: number;
}

function dicomDate(d: Date): { date: string; time: string } {
  const iso = d.toISOString();
  return { date: iso.slice(0, 10).replace(/-/g, ""), time: iso.slice(11, 19).replace(/:/g, "") };
}

function phantomImage(p: DemoScannerProfile, sigmaMm: number, seed: number) {
  const rnd = createRandom(seed);
  const spacing: PixelSpacingMm = { x: p.pixelSpacingMm, y: p.pixelSpacingMm };
  const n = p.sizePx;
  const jitter = () => (rnd.uniform() - 0.5) * 2;
  switch (p.method) {
    case "point":
      return makeGaussianPoint({ width: n, height: n, pixelSpacingMm: spacing, sigmaXMm: sigmaMm, centreXPx: n / 2 + jitter(), centreYPx: n / 2 + jitter(), amplitude: 4000, background: 40, noiseSd: 4, seed }).image;
    case "line":
      return makeGaussianLine({ width: n, height: n, pixelSpacingMm: spacing, sigmaMm, angleDeg: 1.5 + jitter() * 0.3, centreXPx: n / 2 + jitter(), amplitude: 800, background: 20, noiseSd: 3, seed }).image;
    case "edge":
      return makeSlantedEdge({ width: n, height: n, pixelSpacingMm: spacing, angleDeg: 3 + jitter() * 0.4, sigmaMm, low: 200, high: 1200, noiseSd: 4, seed, edgeOffsetPx: jitter() }).image;
    case "disk":
      return makeDisk({ width: n, height: n, pixelSpacingMm: spacing, radiusMm: 12.5, centreXPx: n / 2 + jitter(), centreYPx: n / 2 + jitter(), sigmaMm, insideValue: 120, outsideValue: 0, noiseSd: 3, seed, supersampling: 4 }).image;
  }
}

/**
 * The demo scans of one scanner: one per week for `weeks` weeks ending at `end` (Mondays 09:00 UTC ± a few hours),
 * as DICOM files carrying the scanner's identity in their header.
 */
export function* demoScansFor(
  p: DemoScannerProfile,
  identity: { manufacturer: string; model: string; serialNumber: string; stationName: string },
  weeks: number,
  end: Date,
): Generator<DemoScan> {
  const rnd = createRandom(0x5eed + p.key.charCodeAt(0) * 31 + p.key.charCodeAt(p.key.length - 1));
  const lastWeek = weeks - 1 - (p.skipLastWeeks ?? 0);
  for (let week = 0; week <= lastWeek; week++) {
    const acquiredAt = new Date(end.getTime() - (weeks - 1 - week) * 7 * 86_400_000 - Math.round(rnd.uniform() * 6) * 3_600_000);
    const factor = p.sigmaFactor ? p.sigmaFactor(week, weeks) : 1;
    const sigmaMm = p.sigmaMm * factor * (1 + p.scatter * rnd.normal());
    const image = phantomImage(p, sigmaMm, 1000 * week + rnd.poisson(50));
    const { date, time } = dicomDate(acquiredAt);
    const bytes = writeDicom(
      { width: image.width, height: image.height, data: image.data, pixelSpacingMm: image.pixelSpacingMm },
      {
        transferSyntax: "explicit-le",
        bitsAllocated: 16,
        signed: p.modality === "CT",
        modality: p.modality,
        attributes: {
          ...p.attributes,
          Manufacturer: identity.manufacturer,
          ManufacturerModelName: identity.model,
          DeviceSerialNumber: identity.serialNumber,
          StationName: identity.stationName,
          AcquisitionDate: date,
          AcquisitionTime: time,
          StudyDate: date,
          StudyTime: time,
          SeriesDescription: "Halfmax demo resolution phantom",
        },
      },
    );
    yield { week, acquiredAt, fileName: `${p.key}-week-${String(week + 1).padStart(2, "0")}.dcm`, bytes, sigmaMm };
  }
}
