/**
 * Typed error of the image decoders. `code` is stable and machine-readable; `message` says what is wrong with the
 * file and what the user can do about it (export uncompressed, pass the pixel spacing, …).
 */
export type ImageDecodeErrorCode =
  /** The bytes are not a DICOM, PNG or TIFF file we recognise (or are empty). */
  | "not_an_image"
  /** The file ends before the data it announces (cut-off upload or copy). */
  | "truncated"
  /** The container is recognised but its structure is broken (bad tags, bad offsets, corrupt compressed stream). */
  | "malformed"
  /** A DICOM object without Pixel Data (structured report, RT plan, presentation state…). */
  | "no_pixel_data"
  /** Rows × Columns × Number of Frames × bytes per sample disagrees with the pixel data length. */
  | "size_mismatch"
  /** More pixels than the configured limit (protects the server's memory). */
  | "too_many_pixels"
  /** Compressed DICOM transfer syntax we do not decode. */
  | "unsupported_transfer_syntax"
  /** Colour, palette, 1-bit or otherwise non-greyscale pixel format. */
  | "unsupported_pixel_format"
  /** The image carries no pixel spacing and the caller supplied none. */
  | "missing_pixel_spacing"
  /** A caller-supplied option (raw layout, pixel spacing, frame index) is invalid. */
  | "invalid_options";

export class ImageDecodeError extends Error {
  readonly code: ImageDecodeErrorCode;
  constructor(code: ImageDecodeErrorCode, message: string) {
    super(message);
    this.name = "ImageDecodeError";
    this.code = code;
  }
}

/** A non-fatal finding about the decoded file, e.g. spacing taken from Imager Pixel Spacing. */
export interface DecodeWarning {
  /** Stable machine-readable code, e.g. "imager_pixel_spacing", "monochrome1_inverted". */
  code: string;
  message: string;
}
