/**
 * Byte-level encoding of DICOM data elements (PS3.5 §7.1): tag, VR (explicit only), length, value padded to an even
 * length (UI with NUL, other text with a space, binary with 0x00, PS3.5 §6.2), in little or big endian.
 */

/** VRs with the 4-byte length form in explicit VR (PS3.5 Table 7.1-1). */
const LONG_VRS = new Set(["OB", "OD", "OF", "OL", "OV", "OW", "SQ", "UC", "UN", "UR", "UT", "SV", "UV"]);

export interface EncodedElement {
  /** (group << 16) | element. */
  tag: number;
  vr: string;
  value: Uint8Array;
}

export interface ElementEncoding {
  explicitVr: boolean;
  littleEndian: boolean;
}

/** Printable ASCII (the default character repertoire, PS3.5 §6.1.2.1) without control characters. */
function checkText(text: string, vr: string): void {
  if (!/^[\x20-\x7e]*$/.test(text)) throw new Error(`${vr} value "${text}" must be printable ASCII`);
}

/** A text value (AE, CS, DA, DS, IS, LO, PN, SH, TM, UI …) padded to even length. */
export function textValue(vr: string, text: string): Uint8Array {
  checkText(text, vr);
  const padded = text.length % 2 === 1 ? text + (vr === "UI" ? "\0" : " ") : text;
  const out = new Uint8Array(padded.length);
  for (let i = 0; i < padded.length; i++) out[i] = padded.charCodeAt(i);
  return out;
}

export function uint16Value(value: number, littleEndian: boolean): Uint8Array {
  if (!(Number.isInteger(value) && value >= 0 && value <= 0xffff)) throw new Error(`US value must be an integer 0…65535, got ${value}`);
  const out = new Uint8Array(2);
  new DataView(out.buffer).setUint16(0, value, littleEndian);
  return out;
}

export function uint32Value(value: number, littleEndian: boolean): Uint8Array {
  const out = new Uint8Array(4);
  new DataView(out.buffer).setUint32(0, value, littleEndian);
  return out;
}

/**
 * Decimal String (PS3.5 Table 6.2-1): at most 16 characters. Uses the most significant digits that fit, so the
 * written number may be rounded; callers that depend on the exact value should parse the result back.
 * @throws Error for a non-finite number.
 */
export function formatDecimalString(value: number): string {
  if (!Number.isFinite(value)) throw new Error(`a DS value must be finite, got ${value}`);
  for (let digits = 16; digits >= 1; digits--) {
    const text = String(Number(value.toPrecision(digits)));
    if (text.length <= 16) return text;
  }
  throw new Error(`cannot write ${value} as a DICOM decimal string`);
}

/** Integer String (IS): at most 12 characters, range −2³¹ … 2³¹−1. */
export function formatIntegerString(value: number): string {
  if (!(Number.isInteger(value) && value >= -(2 ** 31) && value < 2 ** 31)) throw new Error(`an IS value must be a 32-bit integer, got ${value}`);
  return String(value);
}

function headerLength(vr: string, encoding: ElementEncoding): number {
  if (!encoding.explicitVr) return 8;
  return LONG_VRS.has(vr) ? 12 : 8;
}

/**
 * Concatenates elements (sorted here by tag, as PS3.5 §7.1 requires) into one byte array.
 * @throws Error when a short-form value exceeds 65 534 bytes.
 */
export function encodeElements(elements: EncodedElement[], encoding: ElementEncoding): Uint8Array {
  const sorted = [...elements].sort((a, b) => a.tag - b.tag);
  let total = 0;
  for (const e of sorted) total += headerLength(e.vr, encoding) + e.value.length + (e.value.length % 2);
  const out = new Uint8Array(total);
  const view = new DataView(out.buffer);
  const le = encoding.littleEndian;
  let pos = 0;
  for (const e of sorted) {
    const length = e.value.length + (e.value.length % 2);
    view.setUint16(pos, e.tag >>> 16, le);
    view.setUint16(pos + 2, e.tag & 0xffff, le);
    if (!encoding.explicitVr) {
      view.setUint32(pos + 4, length, le);
      pos += 8;
    } else {
      out[pos + 4] = e.vr.charCodeAt(0);
      out[pos + 5] = e.vr.charCodeAt(1);
      if (LONG_VRS.has(e.vr)) {
        view.setUint32(pos + 8, length, le);
        pos += 12;
      } else {
        if (length > 0xfffe) throw new Error(`value of VR ${e.vr} too long for tag ${e.tag.toString(16)}: ${length} bytes`);
        view.setUint16(pos + 6, length, le);
        pos += 8;
      }
    }
    out.set(e.value, pos);
    pos += length; // a padding byte, if any, is already 0
  }
  return out;
}
