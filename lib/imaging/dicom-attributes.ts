/**
 * The header attributes Halfmax keeps from a DICOM file, by keyword (tags and VRs from PS3.6 Table 6-1). Equipment,
 * acquisition and identification attributes for the QA record; patient attributes are deliberately not read.
 */
import type { DataSet } from "dicom-parser";

/** How a value is read: text (AE, CS, DA, LO, SH, TM, UI…), decimal/integer strings (DS, IS), or binary US. */
export type AttributeKind = "text" | "ds" | "is" | "us";

export interface AttributeDefinition {
  keyword: string;
  /** dicom-parser tag key, "xGGGGEEEE". */
  tag: string;
  vr: string;
  kind: AttributeKind;
}

const A = (keyword: string, group: string, element: string, vr: string, kind: AttributeKind): AttributeDefinition => ({
  keyword,
  tag: `x${group}${element}`.toLowerCase(),
  vr,
  kind,
});

export const DICOM_ATTRIBUTES: readonly AttributeDefinition[] = [
  A("ImageType", "0008", "0008", "CS", "text"),
  A("SOPClassUID", "0008", "0016", "UI", "text"),
  A("SOPInstanceUID", "0008", "0018", "UI", "text"),
  A("StudyDate", "0008", "0020", "DA", "text"),
  A("SeriesDate", "0008", "0021", "DA", "text"),
  A("AcquisitionDate", "0008", "0022", "DA", "text"),
  A("ContentDate", "0008", "0023", "DA", "text"),
  A("AcquisitionDateTime", "0008", "002A", "DT", "text"),
  A("StudyTime", "0008", "0030", "TM", "text"),
  A("SeriesTime", "0008", "0031", "TM", "text"),
  A("AcquisitionTime", "0008", "0032", "TM", "text"),
  A("ContentTime", "0008", "0033", "TM", "text"),
  A("Modality", "0008", "0060", "CS", "text"),
  A("PresentationIntentType", "0008", "0068", "CS", "text"),
  A("Manufacturer", "0008", "0070", "LO", "text"),
  A("StationName", "0008", "1010", "SH", "text"),
  A("StudyDescription", "0008", "1030", "LO", "text"),
  A("SeriesDescription", "0008", "103E", "LO", "text"),
  A("ManufacturerModelName", "0008", "1090", "LO", "text"),
  A("BodyPartExamined", "0018", "0015", "CS", "text"),
  A("SliceThickness", "0018", "0050", "DS", "ds"),
  A("KVP", "0018", "0060", "DS", "ds"),
  A("SpacingBetweenSlices", "0018", "0088", "DS", "ds"),
  A("DeviceSerialNumber", "0018", "1000", "LO", "text"),
  A("SoftwareVersions", "0018", "1020", "LO", "text"),
  A("ProtocolName", "0018", "1030", "LO", "text"),
  A("ReconstructionDiameter", "0018", "1100", "DS", "ds"),
  A("DistanceSourceToDetector", "0018", "1110", "DS", "ds"),
  A("DistanceSourceToPatient", "0018", "1111", "DS", "ds"),
  A("EstimatedRadiographicMagnificationFactor", "0018", "1114", "DS", "ds"),
  A("ExposureTime", "0018", "1150", "IS", "is"),
  A("XRayTubeCurrent", "0018", "1151", "IS", "is"),
  A("Exposure", "0018", "1152", "IS", "is"),
  A("FilterType", "0018", "1160", "SH", "text"),
  A("ImagerPixelSpacing", "0018", "1164", "DS", "ds"),
  A("ConvolutionKernel", "0018", "1210", "SH", "text"),
  A("StudyInstanceUID", "0020", "000D", "UI", "text"),
  A("SeriesInstanceUID", "0020", "000E", "UI", "text"),
  A("SeriesNumber", "0020", "0011", "IS", "is"),
  A("InstanceNumber", "0020", "0013", "IS", "is"),
  A("ImagePositionPatient", "0020", "0032", "DS", "ds"),
  A("ImageOrientationPatient", "0020", "0037", "DS", "ds"),
  A("SliceLocation", "0020", "1041", "DS", "ds"),
  A("PhotometricInterpretation", "0028", "0004", "CS", "text"),
  A("NumberOfFrames", "0028", "0008", "IS", "is"),
  A("Rows", "0028", "0010", "US", "us"),
  A("Columns", "0028", "0011", "US", "us"),
  A("PixelSpacing", "0028", "0030", "DS", "ds"),
  A("PixelSpacingCalibrationType", "0028", "0A02", "CS", "text"),
  A("BitsAllocated", "0028", "0100", "US", "us"),
  A("BitsStored", "0028", "0101", "US", "us"),
  A("HighBit", "0028", "0102", "US", "us"),
  A("PixelRepresentation", "0028", "0103", "US", "us"),
  A("RescaleIntercept", "0028", "1052", "DS", "ds"),
  A("RescaleSlope", "0028", "1053", "DS", "ds"),
  A("RescaleType", "0028", "1054", "LO", "text"),
  A("LossyImageCompression", "0028", "2110", "CS", "text"),
  A("Units", "0054", "1001", "CS", "text"),
];

/**
 * Reads every attribute of DICOM_ATTRIBUTES from the data set: single numbers for DS/IS/US with one value, the
 * backslash-separated string for multi-valued DS/IS (e.g. PixelSpacing "0.5\0.5"), trimmed text otherwise; null when
 * absent, empty or unparsable. Every keyword is present in the result, so the keys are stable.
 */
export function readDicomAttributes(dataSet: DataSet): Record<string, string | number | null> {
  const out: Record<string, string | number | null> = {};
  for (const def of DICOM_ATTRIBUTES) out[def.keyword] = readAttribute(dataSet, def);
  return out;
}

function readAttribute(dataSet: DataSet, def: AttributeDefinition): string | number | null {
  const element = dataSet.elements[def.tag];
  if (!element || element.length === 0) return null;
  if (def.kind === "us") {
    if (element.length < 2) return null;
    return dataSet.uint16(def.tag) ?? null;
  }
  const text = dataSet.string(def.tag);
  if (text === undefined || text === "") return null;
  if (def.kind === "text") return text;
  if (text.includes("\\")) return text;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}
