/**
 * Greyscale PNG decoding (PNG spec, ISO/IEC 15948) with pngjs. Bit depths 1–16 keep their integer sample values
 * (pngjs `skipRescale`, so 16-bit data are not squeezed to 8 bits). Colour PNGs are accepted only when every pixel
 * has R = G = B. PNG carries no usable pixel spacing (pHYs is a print resolution), so `pixelSpacingMm` is null.
 */
import { PNG } from "pngjs";
import { DEFAULT_MAX_PIXELS, checkPixelLimit, headerlessImage, type DecodeLimits, type DecodedImage } from "./decoded-image";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";

interface PngMetadata {
  width: number;
  height: number;
  depth: number;
  colorType: number;
  transColor?: number[];
  data: Uint8Array | Uint16Array;
}

/** Width and height from the IHDR chunk (PNG spec §11.2.2), read before decoding so huge images are refused cheaply. */
function readHeaderSize(bytes: Uint8Array): { width: number; height: number } {
  if (bytes.length < 33) throw new ImageDecodeError("truncated", `the PNG file is truncated: ${bytes.length} bytes, too short for its header`);
  const type = String.fromCharCode(bytes[12], bytes[13], bytes[14], bytes[15]);
  if (type !== "IHDR") throw new ImageDecodeError("malformed", "the PNG file does not start with an IHDR chunk");
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  return { width: view.getUint32(16, false), height: view.getUint32(20, false) };
}

/**
 * Decodes a greyscale PNG into DecodedImage (one frame, values = PNG sample values, pixelSpacingMm null).
 * @throws ImageDecodeError "truncated" / "malformed" for a damaged file, "too_many_pixels", "unsupported_pixel_format"
 *   for a colour image whose channels differ.
 */
export function decodePng(bytes: Uint8Array, options: DecodeLimits = {}): DecodedImage {
  const { width, height } = readHeaderSize(bytes);
  if (width === 0 || height === 0) throw new ImageDecodeError("malformed", `the PNG image is empty: ${width} × ${height}`);
  checkPixelLimit(width, height, 1, options.maxPixels ?? DEFAULT_MAX_PIXELS);

  let png: PngMetadata;
  try {
    const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    png = PNG.sync.read(buffer, { skipRescale: true }) as unknown as PngMetadata;
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    const truncated = /end|short|incomplete|unexpected/i.test(message);
    throw new ImageDecodeError(
      truncated ? "truncated" : "malformed",
      `the PNG file cannot be decoded (${message})${truncated ? "; it seems truncated — upload the complete file" : ""}`,
    );
  }

  const warnings: DecodeWarning[] = [];
  const rgba = png.data;
  const n = width * height;
  if (rgba.length < 4 * n) throw new ImageDecodeError("truncated", `the PNG file holds fewer pixels than its header's ${width} × ${height}`);
  const maxSample = 2 ** png.depth - 1;
  const colour = png.colorType === 2 || png.colorType === 3 || png.colorType === 6;
  const data = new Float64Array(n);
  let partlyTransparent = false;
  for (let i = 0, p = 0; i < n; i++, p += 4) {
    let grey = rgba[p];
    const alpha = rgba[p + 3];
    // pngjs zeroes all four channels of pixels matching a tRNS key colour; restore the grey value.
    if (png.transColor && alpha === 0 && grey === 0 && rgba[p + 1] === 0 && rgba[p + 2] === 0) grey = png.transColor[0];
    else if (alpha !== (png.colorType === 3 ? 255 : maxSample)) partlyTransparent = true;
    if (colour && (rgba[p + 1] !== grey || rgba[p + 2] !== grey) && !(png.transColor && alpha === 0)) {
      throw new ImageDecodeError(
        "unsupported_pixel_format",
        `the PNG image is in colour (pixel ${i % width}, ${Math.floor(i / width)} has R, G, B = ${grey}, ${rgba[p + 1]}, ${rgba[p + 2]}); save it as greyscale`,
      );
    }
    data[i] = grey;
  }
  if (colour) warnings.push({ code: "colour_png_grey", message: "the PNG is stored as colour but every pixel is grey (R = G = B); the grey value was used" });
  if (partlyTransparent) warnings.push({ code: "alpha_ignored", message: "the PNG has transparency; the alpha channel was ignored" });

  return headerlessImage({
    width,
    height,
    frames: 1,
    data,
    format: "png",
    attributes: { BitsStored: png.colorType === 3 ? 8 : png.depth },
    warnings,
  });
}
