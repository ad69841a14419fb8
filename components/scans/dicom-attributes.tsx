/** Readable list of the DICOM attributes kept with a scan (keyword → value). Server-compatible. */

export interface DicomAttributesProps {
  attributes: Record<string, string | number | null>;
}

/** Display names where splitting the keyword is not enough, and the unit of numeric attributes. */
const NAMES: Record<string, { label: string; unit?: string }> = {
  Modality: { label: "Modality" },
  ManufacturerModelName: { label: "Model" },
  DeviceSerialNumber: { label: "Device serial number" },
  SoftwareVersions: { label: "Software versions" },
  KVP: { label: "Tube voltage (kVp)", unit: "kV" },
  ConvolutionKernel: { label: "Reconstruction kernel" },
  SliceThickness: { label: "Slice thickness", unit: "mm" },
  PixelSpacing: { label: "Pixel spacing (row \\ column)", unit: "mm" },
  ImagerPixelSpacing: { label: "Imager pixel spacing (row \\ column)", unit: "mm" },
  ReconstructionDiameter: { label: "Reconstruction diameter", unit: "mm" },
  Exposure: { label: "Exposure", unit: "mAs" },
  XRayTubeCurrent: { label: "Tube current", unit: "mA" },
  PresentationIntentType: { label: "Presentation intent" },
  LossyImageCompression: { label: "Lossy compression" },
  BitsStored: { label: "Bits stored" },
  NumberOfFrames: { label: "Number of frames" },
  SOPClassUID: { label: "SOP Class UID" },
  SOPInstanceUID: { label: "SOP Instance UID" },
  StudyInstanceUID: { label: "Study Instance UID" },
  SeriesInstanceUID: { label: "Series Instance UID" },
  TransferSyntaxUID: { label: "Transfer syntax" },
  PhotometricInterpretation: { label: "Photometric interpretation" },
};

/** Attributes shown first, in this order; the rest follow alphabetically, UIDs last. */
const ORDER = [
  "Modality", "Manufacturer", "ManufacturerModelName", "StationName", "DeviceSerialNumber", "SoftwareVersions",
  "StudyDate", "StudyTime", "AcquisitionDate", "AcquisitionTime", "ContentDate", "ContentTime", "SeriesDescription",
  "ProtocolName", "KVP", "XRayTubeCurrent", "Exposure", "ConvolutionKernel", "SliceThickness", "ReconstructionDiameter",
  "PixelSpacing", "ImagerPixelSpacing", "Rows", "Columns", "NumberOfFrames", "BitsStored", "PhotometricInterpretation",
  "PresentationIntentType", "LossyImageCompression", "TransferSyntaxUID",
];

/** Transfer syntaxes Halfmax reads (PS3.5 / PS3.6 registry). */
const TRANSFER_SYNTAXES: Record<string, string> = {
  "1.2.840.10008.1.2": "Implicit VR Little Endian",
  "1.2.840.10008.1.2.1": "Explicit VR Little Endian",
  "1.2.840.10008.1.2.2": "Explicit VR Big Endian",
  "1.2.840.10008.1.2.1.99": "Deflated Explicit VR Little Endian",
  "1.2.840.10008.1.2.4.57": "JPEG Lossless (process 14)",
  "1.2.840.10008.1.2.4.70": "JPEG Lossless, first-order prediction",
  "1.2.840.10008.1.2.4.80": "JPEG-LS Lossless",
  "1.2.840.10008.1.2.4.90": "JPEG 2000 Lossless",
  "1.2.840.10008.1.2.5": "RLE Lossless",
};

/** "ManufacturerModelName" → "Manufacturer model name". */
function splitKeyword(keyword: string): string {
  const words = keyword.replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/([A-Z]+)([A-Z][a-z])/g, "$1 $2").split(" ");
  return words.map((w, i) => (i === 0 || /^[A-Z]{2,}$/.test(w) ? w : w.toLowerCase())).join(" ");
}

function readableValue(keyword: string, raw: string | number): string {
  const text = String(raw).trim();
  if (/Date$/.test(keyword) && /^\d{8}$/.test(text)) return `${text.slice(0, 4)}-${text.slice(4, 6)}-${text.slice(6, 8)}`;
  if (/Time$/.test(keyword) && /^\d{2,6}(\.\d+)?$/.test(text)) {
    const [hms] = text.split(".");
    const p = (hms ?? "").padEnd(6, "0");
    return `${p.slice(0, 2)}:${p.slice(2, 4)}:${p.slice(4, 6)}`;
  }
  if (keyword === "TransferSyntaxUID") return TRANSFER_SYNTAXES[text] ? `${TRANSFER_SYNTAXES[text]} (${text})` : text;
  if (keyword === "LossyImageCompression") return text === "01" ? "Yes (01): lossy compression alters the MTF" : text === "00" ? "No (00)" : text;
  const unit = NAMES[keyword]?.unit;
  const value = text.replace(/\\/g, " \\ ");
  return unit ? `${value} ${unit}` : value;
}

export function DicomAttributes({ attributes }: DicomAttributesProps) {
  const keys = Object.keys(attributes).filter((k) => attributes[k] !== null && String(attributes[k]).trim() !== "");
  if (keys.length === 0) return <p className="text-body text-ink-muted">This file carried no DICOM attributes (PNG, TIFF or raw image).</p>;
  const rank = (k: string) => {
    const i = ORDER.indexOf(k);
    if (i >= 0) return i;
    return k.endsWith("UID") ? 2000 : 1000;
  };
  keys.sort((a, b) => rank(a) - rank(b) || a.localeCompare(b));
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-[minmax(0,14rem)_minmax(0,1fr)]" data-testid="dicom-attributes">
      {keys.map((k) => (
        <div key={k} className="contents">
          <dt className="pt-0.5 text-caption font-medium text-ink-muted" title={k}>
            {NAMES[k]?.label ?? splitKeyword(k)}
          </dt>
          <dd className="min-w-0 break-words text-body text-ink [overflow-wrap:anywhere]">{readableValue(k, attributes[k]!)}</dd>
        </div>
      ))}
    </dl>
  );
}
