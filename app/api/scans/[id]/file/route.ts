import { getScanDetail } from "@/db/queries/scans";
import { parseId, withUser } from "@/lib/api/handler";
import { storage } from "@/lib/storage/file-storage";

export const dynamic = "force-dynamic";

const TYPES: Record<string, string> = { dicom: "application/dicom", png: "image/png", tiff: "image/tiff", raw: "application/octet-stream" };

// GET /api/scans/{id}/file – download the original uploaded file
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) => {
  const scan = await getScanDetail(parseId(params.id, "Scan"), user);
  const bytes = await storage().get(scan.storageKey);
  const name = scan.fileName.replace(/[^\w.\-]+/g, "_");
  return new Response(new Blob([bytes as BlobPart]), {
    headers: {
      "content-type": TYPES[scan.format] ?? "application/octet-stream",
      "content-disposition": `attachment; filename="${name}"`,
      "content-length": String(bytes.length),
      "x-content-sha256": scan.fileSha256,
    },
  });
});
