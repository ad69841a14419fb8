// halfmax bench – times image decoding and the four analysis methods on synthetic phantoms.
//
//   npm run bench [-- --runs 15 --warmup 8]
//
// Each case is first run --warmup times (default 5, untimed): the analysis methods run their long pixel loops once
// per call, so V8 needs a few calls before all of their code is optimised; the timed runs then measure steady state.
//
// Prints minimum, median and 95th-percentile wall time per case (on a shared machine the minimum is the run least
// disturbed by other processes), the high-water mark of JS memory (V8 heap + array buffers, sampled after each run),
// the process's peak resident set size, and each case's target; a missed target (judged on the median) is flagged but
// never fails the process (speed is reported, not asserted). Phantom generation is not timed.
import { parseArgs } from "node:util";
import os from "node:os";
import { analyse } from "../lib/analysis";
import type { GrayImage } from "../lib/analysis/types";
import { decodeImage, writeDicom } from "../lib/imaging";
import { makeDisk } from "../lib/phantoms/disk";
import { makeSlantedEdge } from "../lib/phantoms/edge";
import { makeGaussianLine } from "../lib/phantoms/line";
import { makeGaussianPoint } from "../lib/phantoms/point";
import { createRandom } from "../lib/phantoms/random";

interface BenchCase {
  name: string;
  /** Target median, ms; null = none set. */
  targetMs: number | null;
  run: () => unknown;
}

interface BenchRow {
  name: string;
  minMs: number;
  medianMs: number;
  p95Ms: number;
  targetMs: number | null;
  heapPeakMb: number;
}

/** Quantile by linear interpolation between order statistics (common practice). */
function quantile(sorted: number[], q: number): number {
  const pos = (sorted.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return sorted[lo] + (sorted[hi] - sorted[lo]) * (pos - lo);
}

/** A 3000 × 3000, 16-bit unsigned Explicit VR LE DICOM with seeded noise on a gradient (about 18 MB). */
function largeDicom(): Uint8Array {
  const size = 3000;
  const random = createRandom(3000);
  const data = new Float64Array(size * size);
  for (let i = 0; i < data.length; i++) data[i] = Math.round(1000 + ((i % size) * 40000) / size + 50 * random.normal());
  return writeDicom({ width: size, height: size, data, pixelSpacingMm: { x: 0.14, y: 0.14 } }, {
    transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "DX",
  });
}

function buildCases(): BenchCase[] {
  const dicom = largeDicom();
  const point: GrayImage = makeGaussianPoint({
    width: 512, height: 512, pixelSpacingMm: 0.1, sigmaXMm: 0.25, centreXPx: 255.3, centreYPx: 256.6,
    amplitude: 1000, background: 100, noiseSd: 2, seed: 1,
  }).image;
  const disk: GrayImage = makeDisk({
    width: 512, height: 512, pixelSpacingMm: 0.1, radiusMm: 12, centreXPx: 255.4, centreYPx: 256.2, sigmaMm: 0.3,
    insideValue: 1000, outsideValue: 0, noiseSd: 5, seed: 2,
  }).image;
  const edge: GrayImage = makeSlantedEdge({
    width: 2048, height: 2048, pixelSpacingMm: 0.1, angleDeg: 2.5, sigmaMm: 0.15, low: 100, high: 1000, noiseSd: 5, seed: 3,
  }).image;
  const line: GrayImage = makeGaussianLine({
    width: 512, height: 512, pixelSpacingMm: 0.1, angleDeg: 2, sigmaMm: 0.3, amplitude: 1000, background: 50, noiseSd: 2, seed: 4,
  }).image;
  return [
    { name: "decode DICOM 3000×3000 16-bit", targetMs: 60, run: () => decodeImage(dicom) },
    { name: "point 512×512", targetMs: 20, run: () => analyse(point, { method: "point" }) },
    { name: "disk 512×512", targetMs: 20, run: () => analyse(disk, { method: "disk" }) },
    // Uploads default to "auto": method choice plus the disk method (the object search runs once).
    { name: "disk 512×512, auto", targetMs: null, run: () => analyse(disk) },
    { name: "edge 2048×2048", targetMs: 150, run: () => analyse(edge, { method: "edge" }) },
    { name: "line 512×512", targetMs: null, run: () => analyse(line, { method: "line" }) },
  ];
}

function measure(c: BenchCase, runs: number, warmup: number): BenchRow {
  for (let i = 0; i < warmup; i++) c.run();
  const times: number[] = [];
  const jsMemory = () => {
    const m = process.memoryUsage();
    return m.heapUsed + m.arrayBuffers; // typed-array storage lives outside the V8 heap
  };
  let heapPeak = jsMemory();
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const out = c.run();
    times.push(performance.now() - t0);
    // Sampled while the result is still referenced, so it counts towards the high-water mark.
    heapPeak = Math.max(heapPeak, jsMemory());
    if (out === undefined) throw new Error(`${c.name} returned nothing`);
  }
  times.sort((a, b) => a - b);
  return { name: c.name, minMs: times[0]!, medianMs: quantile(times, 0.5), p95Ms: quantile(times, 0.95), targetMs: c.targetMs, heapPeakMb: heapPeak / 2 ** 20 };
}

function main(): void {
  const { values } = parseArgs({ options: { runs: { type: "string", default: "10" }, warmup: { type: "string", default: "5" } } });
  const runs = Number(values.runs);
  const warmup = Number(values.warmup);
  if (!(Number.isInteger(runs) && runs >= 1 && Number.isInteger(warmup) && warmup >= 0)) {
    process.stderr.write("halfmax bench: --runs must be an integer ≥ 1 and --warmup ≥ 0\n");
    process.exitCode = 2;
    return;
  }
  process.stdout.write(`Halfmax benchmark — Node ${process.version}, ${os.cpus().length} CPU(s), ${runs} runs after ${warmup} warm-up\n`);
  process.stdout.write("generating phantoms…\n");
  const cases = buildCases();
  const header = `${"case".padEnd(32)}${"min ms".padStart(8)}${"median ms".padStart(11)}${"p95 ms".padStart(10)}${"target ms".padStart(11)}${"JS mem peak MB".padStart(16)}  status`;
  process.stdout.write(`\n${header}\n${"-".repeat(header.length)}\n`);
  let misses = 0;
  for (const c of cases) {
    const r = measure(c, runs, warmup);
    const miss = r.targetMs !== null && r.medianMs > r.targetMs;
    if (miss) misses++;
    const status = r.targetMs === null ? "(no target)" : miss ? "MISS" : "ok";
    process.stdout.write(
      `${r.name.padEnd(32)}${r.minMs.toFixed(1).padStart(8)}${r.medianMs.toFixed(1).padStart(11)}${r.p95Ms.toFixed(1).padStart(10)}${(r.targetMs === null ? "—" : String(r.targetMs)).padStart(11)}${r.heapPeakMb.toFixed(0).padStart(16)}  ${status}\n`,
    );
  }
  const peakRssMb = process.resourceUsage().maxRSS / 1024; // maxRSS is in KiB
  process.stdout.write(`\npeak resident set size (process high-water mark): ${peakRssMb.toFixed(0)} MB\n`);
  process.stdout.write(misses === 0 ? "all targets met\n" : `${misses} target(s) missed (reported only; the benchmark does not fail on speed)\n`);
}

main();
