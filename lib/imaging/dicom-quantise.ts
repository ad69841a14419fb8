/**
 * Quantisation of physical values into DICOM stored values for the writer: value = slope · stored + intercept
 * (PS3.3 C.11.1.1.2), stored values in the range Bits Stored and Pixel Representation allow.
 */
import { formatDecimalString } from "./dicom-element-encoder";

export interface QuantisedPixels {
  stored: Float64Array;
  slope: number;
  intercept: number;
  /** The DS texts written to the file; `slope`/`intercept` are exactly their parsed values. */
  slopeText: string;
  interceptText: string;
}

export interface StoredRange {
  min: number;
  max: number;
}

export function storedRange(bitsStored: number, signed: boolean): StoredRange {
  return signed ? { min: -(2 ** (bitsStored - 1)), max: 2 ** (bitsStored - 1) - 1 } : { min: 0, max: 2 ** bitsStored - 1 };
}

/**
 * Stored values for `values`.
 *
 * - Slope/intercept given: stored = round((v − intercept) / slope), with the DS-rounded slope and intercept.
 * - Not given, and every value an integer inside the stored range: identity (slope 1, intercept 0).
 * - Otherwise: the linear map of [min, max] of the data onto the full stored range (slope and intercept rounded to
 *   16-character DS), so quantisation error is at most slope / 2.
 *
 * A stored value that falls outside the range by at most one step (DS rounding of the slope) is clamped.
 * @throws Error for non-finite values, or given slope/intercept that put values further outside the range.
 */
export function quantise(values: ArrayLike<number>, range: StoredRange, slopeGiven?: number, interceptGiven?: number): QuantisedPixels {
  let min = Infinity;
  let max = -Infinity;
  let allIntegers = true;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) throw new Error(`pixel ${i} is not a finite number: ${v}`);
    if (v < min) min = v;
    if (v > max) max = v;
    if (allIntegers && !Number.isInteger(v)) allIntegers = false;
  }
  let slopeText: string;
  let interceptText: string;
  if (slopeGiven !== undefined || interceptGiven !== undefined) {
    const s = slopeGiven ?? 1;
    if (!(Number.isFinite(s) && s !== 0)) throw new Error(`rescale slope must be a non-zero finite number, got ${s}`);
    slopeText = formatDecimalString(s);
    interceptText = formatDecimalString(interceptGiven ?? 0);
  } else if (allIntegers && min >= range.min && max <= range.max) {
    slopeText = "1";
    interceptText = "0";
  } else {
    const s = max > min ? (max - min) / (range.max - range.min) : 1;
    slopeText = formatDecimalString(s);
    interceptText = formatDecimalString(min - Number(slopeText) * range.min);
  }
  const slope = Number(slopeText);
  const intercept = Number(interceptText);
  const stored = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    let q = Math.round((values[i] - intercept) / slope);
    if (q < range.min || q > range.max) {
      if (q < range.min - 1 || q > range.max + 1) {
        throw new Error(
          `value ${values[i]} maps to stored value ${q}, outside ${range.min}…${range.max} (slope ${slopeText}, intercept ${interceptText})`,
        );
      }
      q = Math.min(range.max, Math.max(range.min, q));
    }
    stored[i] = q;
  }
  return { stored, slope, intercept, slopeText, interceptText };
}
