/**
 * The fictional demo setting: the Northmere Valley Health imaging group, two sites, six scanners, one user per role.
 * Every name here is invented. Used by `npm start` (once) and by the end-to-end tests.
 */
import type { Modality, Role } from "@/db/schema";

export const DEMO_GROUP_NAME = "Northmere Valley Health";

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: "admin@halfmax.test", name: "Rowan Pell", role: "admin" },
  { email: "physicist@halfmax.test", name: "Dr Ilse Varga", role: "physicist" },
  { email: "lead@halfmax.test", name: "Marta Quennell", role: "lead" },
  { email: "engineer@halfmax.test", name: "Tomasz Brierley", role: "engineer" },
];

export const DEMO_SITES = [
  { key: "general", name: "Northmere General Hospital", city: "Northmere" },
  { key: "kestrel", name: "Kestrel Bay Clinic", city: "Kestrel Bay" },
] as const;

export interface DemoScanner {
  key: string;
  site: (typeof DEMO_SITES)[number]["key"];
  name: string;
  modality: Modality;
  manufacturer: string;
  model: string;
  serialNumber: string;
  location: string;
  method: "point" | "line" | "edge" | "disk";
  test: { name: string; phantom: string; protocol: string; frequency: "weekly" | "monthly" };
}

/** Manufacturer names are invented too ("Corvane", "Lumeris", "Tessaract"): no real products are implied. */
export const DEMO_SCANNERS: DemoScanner[] = [
  {
    key: "ct1", site: "general", name: "CT 1 (Emergency)", modality: "CT", manufacturer: "Corvane Medical", model: "Axion 128",
    serialNumber: "CV-AX128-0412", location: "Emergency dept, room E2", method: "disk",
    test: { name: "TTF from 25 mm acrylic insert", phantom: "Acrylic insert, 25 mm, in 20 cm water cylinder", protocol: "120 kV, 200 mAs, 0.5 mm pixels, standard kernel", frequency: "weekly" },
  },
  {
    key: "ct2", site: "kestrel", name: "CT Kestrel", modality: "CT", manufacturer: "Lumeris Imaging", model: "Helix S64",
    serialNumber: "LM-HS64-2207", location: "Radiology, room 3", method: "point",
    test: { name: "Bead PSF", phantom: "0.28 mm tungsten-carbide bead", protocol: "120 kV, 250 mAs, 50 mm display FOV, sharp kernel", frequency: "weekly" },
  },
  {
    key: "pet", site: "general", name: "PET/CT Orion", modality: "PT", manufacturer: "Tessaract Systems", model: "Orion TF",
    serialNumber: "TS-OR-0091", location: "Nuclear medicine, bay 1", method: "point",
    test: { name: "Point-source resolution at 1 cm", phantom: "F-18 capillary point source in air", protocol: "FBP, 1 mm voxels, no smoothing", frequency: "weekly" },
  },
  {
    key: "gc", site: "general", name: "Gamma camera Vela", modality: "NM", manufacturer: "Corvane Medical", model: "Vela DH",
    serialNumber: "CV-VDH-1180", location: "Nuclear medicine, room 2", method: "line",
    test: { name: "System LSF at 100 mm", phantom: "Tc-99m capillary line source, 100 mm from LEHR collimator", protocol: "256×256 matrix, zoom 2", frequency: "weekly" },
  },
  {
    key: "dr", site: "kestrel", name: "DR Room 1", modality: "DX", manufacturer: "Lumeris Imaging", model: "Flatline 43",
    serialNumber: "LM-FL43-5532", location: "General X-ray, room 1", method: "edge",
    test: { name: "Presampled MTF, tungsten edge", phantom: "1 mm W edge plate on the detector, about 3° tilt", protocol: "RQA5, for-processing image", frequency: "weekly" },
  },
  {
    key: "mg", site: "general", name: "Mammography Lyra", modality: "MG", manufacturer: "Tessaract Systems", model: "Lyra DM",
    serialNumber: "TS-LY-3310", location: "Breast unit, room B1", method: "edge",
    test: { name: "Presampled MTF, edge at chest wall", phantom: "Steel edge test device, about 3° tilt", protocol: "28 kV Mo/Mo, 2 mm Al", frequency: "weekly" },
  },
];
