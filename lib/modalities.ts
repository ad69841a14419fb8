import type { Modality } from "@/db/schema";

/** DICOM Modality (0008,0060) codes used for scanners, with readable names. */
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

export function modalityLabel(m: Modality): string {
  return m === "CT" ? "CT" : `${MODALITY_NAMES[m]} (${m})`;
}
