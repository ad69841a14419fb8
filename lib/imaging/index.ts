/**
 * lib/imaging: DICOM / PNG / TIFF / raw decoding into physical-value images, and a DICOM writer for synthetic
 * phantoms. Pure TypeScript (no fs, no node: imports); file reading belongs to scripts/ and the server.
 */
export {
  DEFAULT_MAX_PIXELS,
  frameImage,
  selectFrameForAnalysis,
  type DecodedImage,
  type DecodeLimits,
  type ImageFormat,
  type PixelSpacingSource,
} from "./decoded-image";
export { ImageDecodeError, type DecodeWarning, type ImageDecodeErrorCode } from "./image-decode-error";
export { decodeImage, type DecodeImageOptions } from "./decode";
export { decodeDicom, type DicomDecodeOptions } from "./dicom";
export { decodePng } from "./png";
export { decodeTiff } from "./tiff";
export { decodeRaw, parseRawSpec, RAW_SAMPLE_TYPES, type RawOptions, type RawSampleType } from "./raw";
export { sniffImageFormat, sniffDicomLayout, type SniffedFormat, type DicomLayout } from "./sniff";
export { findTransferSyntax, TRANSFER_SYNTAXES, type TransferSyntaxInfo } from "./transfer-syntax";
export { DICOM_ATTRIBUTES } from "./dicom-attributes";
export { writeDicom, type DicomWriteImage, type DicomWriteOptions, type DicomTransferSyntaxChoice } from "./dicom-writer";
export { SOP_CLASS } from "./dicom-writer-pixels";
export { HALFMAX_IMPLEMENTATION_CLASS_UID, newUid, uidFromUuid } from "./dicom-uid";
