import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { decodeDicom } from "@/lib/imaging/dicom";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { pydicomPixels } from "./helpers/python-reference";

// Test files shipped with Debian's python3-pydicom (public test data of the pydicom project).
const PYDICOM_FILES = "/usr/lib/python3/dist-packages/pydicom/data/test_files";
const file = (name: string) => path.join(PYDICOM_FILES, name);
const present = (name: string) => existsSync(file(name));
const read = (name: string) => new Uint8Array(readFileSync(file(name)));

/** Files decodeDicom must read like pydicom: syntaxes, byte orders, signedness, 32-bit multi-frame, padding. */
const READABLE = [
  "CT_small.dcm", // Explicit VR LE, signed 16-bit, Rescale Intercept −1024
  "MR_small.dcm", // Explicit VR LE
  "MR_small_implicit.dcm", // Implicit VR LE
  "MR_small_bigendian.dcm", // Explicit VR BE
  "MR_small_expb.dcm", // Explicit VR BE (other writer)
  "MR_small_padded.dcm", // Pixel Data with trailing padding bytes
  "rtdose.dcm", // 32-bit unsigned, 15 frames, Implicit VR LE
  "rtdose_expb.dcm", // the same, Explicit VR BE
  "rtdose_1frame.dcm",
  "rtdose_expb_1frame.dcm",
].filter((name) => {
  if (!present(name)) console.warn(`skipping ${name}: not found in ${PYDICOM_FILES} (install python3-pydicom)`);
  return present(name);
});

describe("decodeDicom(pydicom test files) agrees with pydicom's pixel_array", () => {
  const reference = READABLE.length > 0 ? pydicomPixels(READABLE.map(file)) : [];

  it.each(READABLE.map((name, i) => [name, i] as const))("decodeDicom(%s) equals pydicom's modality-LUT output", (name, i) => {
    const ref = reference[i];
    const decoded = decodeDicom(read(name));
    expect([decoded.height, decoded.width, decoded.frames]).toEqual([ref.rows, ref.columns, ref.frames]);
    expect(decoded.data.length).toBe(ref.rescaled.length);
    for (let k = 0; k < ref.rescaled.length; k++) {
      if (decoded.data[k] !== ref.rescaled[k]) expect.fail(`${name}: sample ${k} is ${decoded.data[k]}, pydicom says ${ref.rescaled[k]}`);
    }
    if (ref.pixelSpacing) expect([decoded.pixelSpacingMm?.y, decoded.pixelSpacingMm?.x]).toEqual(ref.pixelSpacing);
    else expect(decoded.pixelSpacingMm).toBeNull();
  });

  it.skipIf(!present("MR_small_padded.dcm"))("decodeDicom(MR_small_padded.dcm) reports the ignored padding as a warning", () => {
    expect(decodeDicom(read("MR_small_padded.dcm")).warnings.map((w) => w.code)).toContain("pixel_data_padding");
  });

  it.skipIf(!present("CT_small.dcm"))("decodeDicom(CT_small.dcm) exposes the header attributes by DICOM keyword", () => {
    const decoded = decodeDicom(read("CT_small.dcm"));
    expect(decoded.modality).toBe("CT");
    expect(decoded.transferSyntaxUid).toBe("1.2.840.10008.1.2.1");
    expect(decoded.attributes.Modality).toBe("CT");
    expect(decoded.attributes.RescaleIntercept).toBe(-1024);
    expect(decoded.attributes.BitsStored).toBe(16);
    expect(typeof decoded.attributes.SOPInstanceUID).toBe("string");
  });
});

/** Files decodeDicom must refuse, with the code and the words the user needs. */
const REJECTED: { name: string; code: string; mentions: string[] }[] = [
  { name: "MR_small_RLE.dcm", code: "unsupported_transfer_syntax", mentions: ["RLE Lossless", "1.2.840.10008.1.2.5", "uncompressed"] },
  { name: "MR_small_jpeg_ls_lossless.dcm", code: "unsupported_transfer_syntax", mentions: ["JPEG-LS", "1.2.840.10008.1.2.4.80"] },
  { name: "MR_small_jp2klossless.dcm", code: "unsupported_transfer_syntax", mentions: ["JPEG 2000", "1.2.840.10008.1.2.4.90"] },
  { name: "JPEG2000.dcm", code: "unsupported_transfer_syntax", mentions: ["1.2.840.10008.1.2.4.91", "MTF"] },
  { name: "JPEG-lossy.dcm", code: "unsupported_transfer_syntax", mentions: ["JPEG Extended", "1.2.840.10008.1.2.4.51", "lossy", "MTF"] },
  { name: "SC_rgb_jpeg_dcmtk.dcm", code: "unsupported_transfer_syntax", mentions: ["JPEG Baseline", "1.2.840.10008.1.2.4.50", "lossy"] },
  { name: "image_dfl.dcm", code: "unsupported_transfer_syntax", mentions: ["Deflated", "1.2.840.10008.1.2.1.99"] },
  { name: "rtdose_rle.dcm", code: "unsupported_transfer_syntax", mentions: ["RLE Lossless"] },
  { name: "SC_rgb_jpeg_gdcm.dcm", code: "unsupported_pixel_format", mentions: ["RGB", "greyscale"] }, // JPEG Lossless, but colour
  { name: "ExplVR_BigEnd.dcm", code: "unsupported_pixel_format", mentions: ["RGB"] },
  { name: "SC_ybr_full_422_uncompressed.dcm", code: "unsupported_pixel_format", mentions: ["YBR_FULL_422"] },
  { name: "liver_1frame.dcm", code: "unsupported_pixel_format", mentions: ["Bits Allocated 1"] },
  { name: "MR_truncated.dcm", code: "truncated", mentions: ["truncated"] },
  { name: "rtplan.dcm", code: "no_pixel_data", mentions: ["Pixel Data"] },
  { name: "reportsi.dcm", code: "no_pixel_data", mentions: ["structured report"] },
  { name: "waveform_ecg.dcm", code: "no_pixel_data", mentions: ["not an image"] },
];

describe("decodeDicom(pydicom test files it cannot analyse) throws a clear ImageDecodeError", () => {
  it.each(REJECTED.map((r) => [r.name, r] as const))("decodeDicom(%s) is refused", (name, r) => {
    if (!present(name)) {
      console.warn(`skipping ${name}: not found in ${PYDICOM_FILES}`);
      return;
    }
    let error: unknown;
    try {
      decodeDicom(read(name));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImageDecodeError);
    expect((error as ImageDecodeError).code).toBe(r.code);
    for (const word of r.mentions) expect((error as Error).message).toContain(word);
  });
});
