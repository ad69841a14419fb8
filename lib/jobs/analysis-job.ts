/**
 * The work done off the request thread: decode an uploaded file and analyse it, or decode it for display.
 * Pure (no node: imports) so the worker bundle, the tests and the CLI-like callers share it.
 */
import { analyse } from "../analysis";
import type { AnalysisResult, MethodChoice, PixelSpacingMm, Roi } from "../analysis/types";
import { decodeImage, frameImage, selectFrameForAnalysis, type DecodedImage } from "../imaging";

export interface AnalyseJob {
  kind: "analyse";
  bytes: Uint8Array;
  method: MethodChoice;
  /** Caller-supplied spacing, mm; required when the file has none (PNG/TIFF). */
  pixelSpacingMm?: PixelSpacingMm | null;
  roi?: Roi | null;
  frame?: number | null;
  maxPixels: number;
}

export interface PreviewJob {
  kind: "preview";
  bytes: Uint8Array;
  pixelSpacingMm?: PixelSpacingMm | null;
  frame?: number | null;
  maxPixels: number;
  /** Longest side of the returned preview; larger frames are block-averaged down. */
  maxSide: number;
}

export type Job = AnalyseJob | PreviewJob;

export interface DecodedSummary {
  width: number;
  height: number;
  frames: number;
  frame: number;
  format: DecodedImage["format"];
  transferSyntaxUid: string | null;
  photometricInterpretation: string | null;
  modality: string | null;
  pixelSpacingMm: PixelSpacingMm | null;
  pixelSpacingSource: DecodedImage["pixelSpacingSource"];
  attributes: Record<string, string | number | null>;
  warnings: { code: string; message: string }[];
}

export interface AnalyseJobOutput {
  kind: "analyse";
  decoded: DecodedSummary;
  result: AnalysisResult;
  timingMs: { decode: number; analysis: number };
}

export interface PreviewJobOutput {
  kind: "preview";
  decoded: DecodedSummary;
  /** Preview pixels (row-major Float32), `scale` original pixels per preview pixel along each axis. */
  width: number;
  height: number;
  scale: number;
  data: Float32Array;
  min: number;
  max: number;
}

export type JobOutput = AnalyseJobOutput | PreviewJobOutput;

function summarise(decoded: DecodedImage, frame: number): DecodedSummary {
  return {
    width: decoded.width,
    height: decoded.height,
    frames: decoded.frames,
    frame,
    format: decoded.format,
    transferSyntaxUid: decoded.transferSyntaxUid,
    photometricInterpretation: decoded.photometricInterpretation,
    modality: decoded.modality,
    pixelSpacingMm: decoded.pixelSpacingMm,
    pixelSpacingSource: decoded.pixelSpacingSource,
    attributes: decoded.attributes,
    warnings: decoded.warnings.map((w) => ({ code: w.code, message: w.message })),
  };
}

function pickFrame(decoded: DecodedImage, frame: number | null | undefined): number {
  return frame === null || frame === undefined ? selectFrameForAnalysis(decoded) : frame;
}

export function runJob(job: Job): JobOutput {
  const t0 = performance.now();
  const decoded = decodeImage(job.bytes, {
    maxPixels: job.maxPixels,
    pixelSpacingMm: job.pixelSpacingMm ?? undefined,
  });
  const frame = pickFrame(decoded, job.frame);
  if (job.kind === "preview") return preview(decoded, frame, job);
  const image = frameImage(decoded, frame);
  const t1 = performance.now();
  const result = analyse(image, { method: job.method, roi: job.roi ?? undefined });
  const t2 = performance.now();
  return { kind: "analyse", decoded: summarise(decoded, frame), result, timingMs: { decode: t1 - t0, analysis: t2 - t1 } };
}

function preview(decoded: DecodedImage, frame: number, job: PreviewJob): PreviewJobOutput {
  const { width, height } = decoded;
  const scale = Math.max(1, Math.ceil(Math.max(width, height) / job.maxSide));
  const w = Math.floor(width / scale);
  const h = Math.floor(height / scale);
  const data = new Float32Array(w * h);
  const offset = frame * width * height;
  let min = Infinity;
  let max = -Infinity;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let sum = 0;
      for (let dy = 0; dy < scale; dy++) {
        const row = offset + (y * scale + dy) * width + x * scale;
        for (let dx = 0; dx < scale; dx++) sum += decoded.data[row + dx]!;
      }
      const v = sum / (scale * scale);
      data[y * w + x] = v;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return { kind: "preview", decoded: summarise(decoded, frame), width: w, height: h, scale, data, min, max };
}
