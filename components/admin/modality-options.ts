import { MODALITIES, type Modality } from "@/db/schema";

/** Option text of the modality select: the DICOM Modality (0008,0060) code with a readable name. */
export const MODALITY_OPTION_LABELS: Record<Modality, string> = {
  CT: "CT — computed tomography",
  PT: "PT — PET",
  NM: "NM — gamma camera / SPECT",
  DX: "DX — digital radiography",
  MG: "MG — mammography",
  CR: "CR — computed radiography",
  RF: "RF — fluoroscopy",
  US: "US — ultrasound",
  MR: "MR — MRI",
  OT: "OT — other",
};

export const MODALITY_OPTIONS = MODALITIES.map((value) => ({ value, label: MODALITY_OPTION_LABELS[value] }));
