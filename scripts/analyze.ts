// halfmax analyze – decode an image file and print its spatial-resolution analysis (or its pixel statistics).
//
//   npm run --silent analyze -- <file> [--method point|line|edge|disk|auto] [--pixel-spacing <mm>[,<mm>]]
//        [--roi x,y,w,h] [--frame N] [--raw WIDTHxHEIGHT[xFRAMES]:type] [--json | --inspect]
//
// Exit codes: 0 success; 2 bad input (unreadable file, undecodable image, image the method cannot analyse, bad
// flags) with one line "halfmax analyze: <message>" on stderr and nothing on stdout; 1 unexpected internal error.
import { readFileSync } from "node:fs";
import { basename } from "node:path";
import { parseArgs } from "node:util";
import { analyse } from "../lib/analysis";
import { AnalysisError } from "../lib/analysis/errors";
import type { MethodChoice, PixelSpacingMm, Roi } from "../lib/analysis/types";
import {
  decodeImage,
  frameImage,
  ImageDecodeError,
  parseRawSpec,
  selectFrameForAnalysis,
  type DecodedImage,
  type RawOptions,
} from "../lib/imaging";
import { toAnalysisJson } from "../lib/report/analysis-json";
import { formatAnalysisReport } from "../lib/report/analysis-text";

const USAGE =
  "usage: analyze <file> [--method point|line|edge|disk|auto] [--pixel-spacing <mm> | <row-mm>,<col-mm>] " +
  "[--roi x,y,w,h] [--frame N (1 = first)] [--raw WIDTHxHEIGHT[xFRAMES]:type] [--json | --inspect]";

const METHODS: readonly MethodChoice[] = ["point", "line", "edge", "disk", "auto"];

/** A problem with the user's input: reported on one stderr line with exit code 2. */
class UsageError extends Error {}

interface CliOptions {
  file: string;
  method: MethodChoice;
  pixelSpacingMm?: PixelSpacingMm;
  roi?: Roi;
  frame?: number;
  raw?: RawOptions;
  json: boolean;
  inspect: boolean;
}

function parsePixelSpacing(text: string): PixelSpacingMm {
  const parts = text.split(",").map((s) => Number(s.trim()));
  if ((parts.length !== 1 && parts.length !== 2) || !parts.every((v) => Number.isFinite(v) && v > 0)) {
    throw new UsageError(`--pixel-spacing must be a positive number of mm, or "<row-mm>,<col-mm>", got "${text}"`);
  }
  return parts.length === 1 ? { x: parts[0], y: parts[0] } : { x: parts[1], y: parts[0] };
}

function parseRoi(text: string): Roi {
  const parts = text.split(",").map((s) => Number(s.trim()));
  if (parts.length !== 4 || !parts.every((v) => Number.isInteger(v) && v >= 0) || parts[2] === 0 || parts[3] === 0) {
    throw new UsageError(`--roi must be four non-negative integers x,y,width,height (width, height > 0), got "${text}"`);
  }
  return { x: parts[0], y: parts[1], width: parts[2], height: parts[3] };
}

function parseCli(argv: string[]): CliOptions {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        method: { type: "string" },
        "pixel-spacing": { type: "string" },
        roi: { type: "string" },
        frame: { type: "string" },
        raw: { type: "string" },
        json: { type: "boolean", default: false },
        inspect: { type: "boolean", default: false },
      },
    });
  } catch (e) {
    throw new UsageError(`${e instanceof Error ? e.message : String(e)}; ${USAGE}`);
  }
  const { values, positionals } = parsed;
  if (positionals.length !== 1) throw new UsageError(`expected exactly one image file, got ${positionals.length}; ${USAGE}`);
  const method = (values.method ?? "auto") as MethodChoice;
  if (!METHODS.includes(method)) throw new UsageError(`--method must be one of ${METHODS.join(", ")}, got "${values.method}"`);
  if (values.json && values.inspect) throw new UsageError("--json and --inspect cannot be combined");
  let frame: number | undefined;
  if (values.frame !== undefined) {
    frame = Number(values.frame);
    if (!Number.isInteger(frame) || frame < 1) throw new UsageError(`--frame must be a frame number from 1, got "${values.frame}"`);
  }
  let raw: RawOptions | undefined;
  if (values.raw !== undefined) {
    try {
      raw = parseRawSpec(values.raw);
    } catch (e) {
      throw new UsageError(`--raw: ${(e as Error).message}`);
    }
  }
  return {
    file: positionals[0],
    method,
    pixelSpacingMm: values["pixel-spacing"] !== undefined ? parsePixelSpacing(values["pixel-spacing"]) : undefined,
    roi: values.roi !== undefined ? parseRoi(values.roi) : undefined,
    frame,
    raw,
    json: values.json ?? false,
    inspect: values.inspect ?? false,
  };
}

function readInput(file: string): Uint8Array {
  try {
    return new Uint8Array(readFileSync(file));
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a directory" : code === "EACCES" ? "permission denied" : (e as Error).message;
    throw new UsageError(`cannot read ${file}: ${reason}`);
  }
}

/** Pixel statistics of the rescaled values, for --inspect. */
function inspectJson(decoded: DecodedImage): Record<string, unknown> {
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  for (const v of decoded.data) {
    if (v < min) min = v;
    if (v > max) max = v;
    sum += v;
  }
  const spacing = decoded.pixelSpacingMm;
  return {
    rows: decoded.height,
    columns: decoded.width,
    frames: decoded.frames,
    min,
    max,
    mean: sum / decoded.data.length,
    pixelSpacingMm: spacing ? [spacing.y, spacing.x] : null,
    transferSyntaxUid: decoded.transferSyntaxUid,
    modality: decoded.modality,
    photometricInterpretation: decoded.photometricInterpretation,
    warnings: decoded.warnings,
  };
}

function run(argv: string[]): string {
  const options = parseCli(argv);
  const bytes = readInput(options.file);
  const t0 = performance.now();
  const decoded = decodeImage(bytes, { raw: options.raw, pixelSpacingMm: options.pixelSpacingMm });
  const decodeMs = performance.now() - t0;
  if (options.inspect) return `${JSON.stringify(inspectJson(decoded))}\n`;

  if (options.frame !== undefined && options.frame > decoded.frames) {
    throw new UsageError(`--frame ${options.frame} is beyond the image's ${decoded.frames} frame(s)`);
  }
  const frameIndex = options.frame !== undefined ? options.frame - 1 : selectFrameForAnalysis(decoded);
  const image = frameImage(decoded, frameIndex);
  const t1 = performance.now();
  const result = analyse(image, { method: options.method, roi: options.roi });
  const analysisMs = performance.now() - t1;
  const timing = { decode: decodeMs, analysis: analysisMs };
  if (options.json) return `${JSON.stringify(toAnalysisJson(result, timing, decoded.warnings))}\n`;
  return formatAnalysisReport({ result, decoded, fileName: basename(options.file), frameIndex, timing });
}

function main(): void {
  let output: string;
  try {
    output = run(process.argv.slice(2));
  } catch (e) {
    if (e instanceof UsageError || e instanceof ImageDecodeError || e instanceof AnalysisError) {
      process.stderr.write(`halfmax analyze: ${e.message.replace(/\s*\n\s*/g, " ")}\n`);
      process.exitCode = 2;
    } else {
      process.stderr.write(`halfmax analyze: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    }
    return;
  }
  process.stdout.write(output);
}

main();
