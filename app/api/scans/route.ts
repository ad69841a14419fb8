import { getScanDetail, listScans } from "@/db/queries/scans";
import { withUser } from "@/lib/api/handler";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { ingestScan } from "@/lib/scans/ingest";
import { scanToJson } from "@/lib/scans/scan-json";
import { createScanSchema, listScansQuerySchema } from "@/lib/validations/scan";

export const dynamic = "force-dynamic";
export const maxDuration = 300;

// GET /api/scans – scans with their current analysis; filters scannerId, method, from, to; paginated (page, pageSize) with total
export const GET = withUser("viewFleet", async ({ req, user }) => {
  const query = listScansQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json(await listScans(query, user));
});

// POST /api/scans – upload an image (multipart: file, scannerId, method?, pixelSpacingMm?, roi?, note?), analyse it, store the result
export const POST = withUser("uploadScans", async ({ req, user }) => {
  const limit = env().MAX_UPLOAD_BYTES;
  const declared = Number(req.headers.get("content-length") ?? 0);
  if (declared > limit + 64 * 1024) throw tooLarge(declared, limit);
  if (!(req.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data")) {
    throw new AppError({ code: "unsupported_media_type", message: "Send the upload as multipart/form-data with a 'file' field" });
  }
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new AppError({ code: "bad_request", message: "The multipart body could not be read: it is malformed or incomplete" });
  }
  const file = form.get("file");
  if (!(file instanceof File)) throw new AppError({ code: "validation_failed", message: "file: attach the image as the 'file' field" });
  if (file.size === 0) throw new AppError({ code: "validation_failed", message: "file: the uploaded file is empty" });
  if (file.size > limit) throw tooLarge(file.size, limit);
  const fields = createScanSchema.parse({
    scannerId: form.get("scannerId") ?? undefined,
    method: form.get("method") ?? undefined,
    pixelSpacingMm: form.get("pixelSpacingMm") ?? undefined,
    roi: form.get("roi") ?? undefined,
    note: form.get("note") ?? undefined,
  });
  const bytes = new Uint8Array(await file.arrayBuffer());
  const { scanId } = await ingestScan({ ...fields, bytes, fileName: file.name || "upload", user });
  return Response.json(scanToJson(await getScanDetail(scanId, user)), { status: 201, headers: { location: `/api/scans/${scanId}` } });
});

function tooLarge(size: number, limit: number): AppError {
  return new AppError({
    code: "payload_too_large",
    message: `The file is ${(size / 1048576).toFixed(1)} MB; the limit is ${(limit / 1048576).toFixed(0)} MB (MAX_UPLOAD_BYTES)`,
  });
}
