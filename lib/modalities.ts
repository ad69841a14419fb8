import { MODALITIES, type Modality } from "@/db/schema";

/** DICOM Modality (0008,0060) codes used for scanners, with readable names. The one table of modality wording. */
export const MODALITY_NAMES: Record<Modality, string> = {
  CT: "CT",
  PT: "PET",
  NM: "Gamma camera / SPECT",
  DX: "Digital radiography",
  MG: "Mammography",
  CR: "Computed radiography",
  RF: "Fluoroscopy",
  US: "Ultrasound",
  MR: "MRI",
  OT: "Other",
};

/** Short names for narrow table cells. */
export const MODALITY_SHORT_NAMES: Record<Modality, string> = {
  ...MODALITY_NAMES,
  NM: "Gamma camera",
  DX: "DR",
  CR: "CR",
};

/** What the code stands for, as shown beside the code in the scanner form. */
const MODALITY_DESCRIPTIONS: Record<Modality, string> = {
  CT: "computed tomography",
  PT: "PET",
  NM: "gamma camera / SPECT",
  DX: "digital radiography",
  MG: "mammography",
  CR: "computed radiography",
  RF: "fluoroscopy",
  US: "ultrasound",
  MR: "MRI",
  OT: "other",
};

export function modalityLabel(m: Modality): string {
  return m === "CT" ? "CT" : `${MODALITY_NAMES[m]} (${m})`;
}

/** "CT — computed tomography": option text of the modality select. */
export function modalityOptionLabel(m: Modality): string {
  return `${m} — ${MODALITY_DESCRIPTIONS[m]}`;
}

export const MODALITY_OPTIONS = MODALITIES.map((value) => ({ value, label: modalityOptionLabel(value) }));
