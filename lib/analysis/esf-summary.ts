/**
 * The common tail of the edge methods (slanted edge, circular edge): ESF → LSF → MTF, the LSF widths, the MTF
 * summary at the Nyquist frequency and the expected MTF noise there.
 */
import { esfToMtf, mtfNoiseSd, type BinnedEsf, type EsfToMtfOptions, type EsfToMtfResult } from "./edge-spread";
import { lsfWidths } from "./lsf-widths";
import { summariseMtf, type MtfSummary } from "./mtf-metrics";

export interface EsfSummaryInputs {
  /** Nyquist frequency of the sampling across the edge, cycles/mm. */
  nyquistCyclesPerMm: number;
  /** ESF bin width, mm. */
  binWidthMm: number;
  /** Pixel noise SD (image units) and the edge contrast (high − low), for the MTF noise estimate. */
  pixelNoiseSd: number;
  contrast: number;
  /** Pixels that went into the ESF. */
  pixelsUsed: number;
}

export interface EsfSummary {
  chain: EsfToMtfResult;
  widths: ReturnType<typeof lsfWidths>;
  summary: MtfSummary;
  /** Expected SD of the MTF at Nyquist from the pixel noise (see mtfNoiseSd). */
  mtfNoiseAtNyquist: number;
}

/** Runs esfToMtf with `options` and summarises the result. Throws what esfToMtf and lsfWidths throw. */
export function summariseEsf(esf: BinnedEsf, options: EsfToMtfOptions, inputs: EsfSummaryInputs): EsfSummary {
  const chain = esfToMtf(esf, options);
  const widths = lsfWidths(chain.lsf, inputs.binWidthMm);
  const summary = summariseMtf(chain.mtf, inputs.nyquistCyclesPerMm);
  const mtfNoiseAtNyquist = mtfNoiseSd(inputs.nyquistCyclesPerMm, {
    pixelNoiseSd: inputs.pixelNoiseSd,
    samplesPerBin: inputs.pixelsUsed / esf.value.length,
    contrast: inputs.contrast,
    binWidthMm: inputs.binWidthMm,
    windowSumSquares: chain.windowSumSquares,
  });
  return { chain, widths, summary, mtfNoiseAtNyquist };
}
