// Minimal type declarations for the two decoders that ship without usable typings: jpeg-lossless-decoder-js 2.1
// (its package.json names a .d.ts that is not published) and utif 3.1. Only the members lib/imaging uses.

declare module "jpeg-lossless-decoder-js" {
  export class Decoder {
    constructor(buffer?: ArrayBuffer | null, numBytes?: number);
    /** Decodes one JPEG Lossless image; numBytes = bytes per output sample (1 → Uint8Array, 2 → Uint16Array). */
    decode(buffer?: ArrayBuffer, offset?: number, length?: number, numBytes?: number): Uint8Array | Uint16Array;
    numComp: number;
    /** Input position after decode(); index > buffer.length means it read past the end. */
    stream: { index: number; buffer: Uint8Array } | null;
    frame: { dimX: number; dimY: number; precision: number; numComp: number };
  }
}

declare module "utif" {
  /** One Image File Directory: tags as "t<number>" → values; decodeImage adds width, height, data (Uint8Array), isLE. */
  export type Ifd = Record<string, unknown>;
  const UTIF: {
    decode(buffer: ArrayBuffer): Ifd[];
    decodeImage(buffer: ArrayBuffer, ifd: Ifd, ifds?: Ifd[]): void;
    encodeImage(rgba: ArrayBuffer | Uint8Array, width: number, height: number, metadata?: Record<string, unknown>): ArrayBuffer;
  };
  export default UTIF;
}
