import { AppError, type ErrorCode } from "@/lib/errors";
import { JobError } from "@/lib/jobs/job-errors";

const DECODE_CODES: Record<string, ErrorCode> = {
  not_an_image: "unsupported_media_type",
  unsupported_transfer_syntax: "unsupported_media_type",
  unsupported_pixel_format: "unsupported_media_type",
  too_many_pixels: "payload_too_large",
};

const HINTS: Record<string, string> = {
  not_an_image: "Upload a DICOM, PNG or TIFF image of the phantom.",
  missing_pixel_spacing: "Give the pixel spacing in mm (pixelSpacingMm) for this file.",
  unsupported_transfer_syntax: "Export the images uncompressed (or JPEG Lossless) from the scanner or PACS and upload again.",
  truncated: "The file is incomplete: copy it again from the scanner or PACS.",
};

/** Maps a decode or analysis failure from the worker to an HTTP error that says what to do. */
export function toUploadError(err: unknown): unknown {
  if (!(err instanceof JobError)) return err;
  if (err.kind === "ImageDecodeError") {
    const hint = HINTS[err.code];
    return new AppError({
      code: DECODE_CODES[err.code] ?? "unprocessable_image",
      message: `${capitalise(err.message)}${hint ? `. ${hint}` : ""}`,
      details: { reason: err.code },
    });
  }
  if (err.kind === "AnalysisError") {
    return new AppError({
      code: "unprocessable_image",
      message: `Analysis failed: ${err.message}. Check the method and region of interest, or choose the method by hand.`,
      details: { reason: err.code },
    });
  }
  if (err.code === "timeout") return new AppError({ code: "unprocessable_image", message: capitalise(err.message), details: { reason: "timeout" } });
  return err;
}

function capitalise(s: string): string {
  const t = s.replace(/\.$/, "");
  return t.charAt(0).toUpperCase() + t.slice(1);
}
