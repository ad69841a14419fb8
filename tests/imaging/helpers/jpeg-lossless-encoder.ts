/**
 * A minimal JPEG Lossless encoder for tests, written from ITU-T T.81 (ISO/IEC 10918-1) Annex H: process 14,
 * one component, predictor selection value 1 (Ra, the left neighbour), point transform 0, one Huffman table.
 * It exists to produce JPEG Lossless DICOM pixel data independently of the decoder under test.
 *
 * Huffman table: the 17 difference categories SSSS = 0…16 (T.81 Table H.2) all get 5-bit codes, assigned in
 * canonical order (T.81 Annex C), so code(SSSS) = SSSS written in 5 bits.
 */
class BitWriter {
  private bytes: number[] = [];
  private acc = 0;
  private n = 0;
  write(value: number, bits: number): void {
    for (let i = bits - 1; i >= 0; i--) {
      this.acc = (this.acc << 1) | ((value >>> i) & 1);
      if (++this.n === 8) this.flushByte();
    }
  }
  private flushByte(): void {
    this.bytes.push(this.acc);
    if (this.acc === 0xff) this.bytes.push(0x00); // byte stuffing, T.81 F.1.2.3
    this.acc = 0;
    this.n = 0;
  }
  finish(): number[] {
    while (this.n !== 0) this.write(1, 1); // pad with 1-bits, T.81 F.1.2.3
    return this.bytes;
  }
}

const u16 = (v: number) => [(v >> 8) & 0xff, v & 0xff];

/** Encodes unsigned samples (< 2^precision, row-major) as a JPEG Lossless SV1 stream. */
export function encodeJpegLossless(samples: ArrayLike<number>, width: number, height: number, precision: number): Uint8Array {
  const out: number[] = [0xff, 0xd8]; // SOI
  out.push(0xff, 0xc3, ...u16(11), precision, ...u16(height), ...u16(width), 1, 1, 0x11, 0); // SOF3
  const bits = new Array(16).fill(0);
  bits[4] = 17; // 17 codes of length 5
  out.push(0xff, 0xc4, ...u16(2 + 17 + 17), 0x00, ...bits, ...Array.from({ length: 17 }, (_, i) => i)); // DHT
  out.push(0xff, 0xda, ...u16(8), 1, 1, 0x00, 1, 0, 0); // SOS: Ss = 1 (predictor), Se = 0, Ah/Al = 0
  const writer = new BitWriter();
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      // Prediction, T.81 H.1.2.1: first sample 2^(P−1); first row Ra; first column Rb; else the selected predictor.
      const prediction = x === 0 && y === 0 ? 2 ** (precision - 1) : x === 0 ? samples[i - width] : samples[i - 1];
      let diff = (samples[i] - prediction) & 0xffff; // modulo 2^16, H.1.2.1
      if (diff >= 0x8000) diff -= 0x10000;
      if (diff === -0x8000) {
        writer.write(16, 5); // SSSS = 16: no additional bits (H.1.2.2)
        continue;
      }
      const magnitude = Math.abs(diff);
      const ssss = magnitude === 0 ? 0 : 32 - Math.clz32(magnitude);
      writer.write(ssss, 5);
      // Additional bits, T.81 F.1.2.1.1: the low SSSS bits of diff, or of diff − 1 when negative.
      if (ssss > 0) writer.write((diff > 0 ? diff : diff - 1) & ((1 << ssss) - 1), ssss);
    }
  }
  out.push(...writer.finish(), 0xff, 0xd9); // EOI
  return new Uint8Array(out);
}
