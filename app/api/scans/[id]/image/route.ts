import { getScanDetail } from "@/db/queries/scans";
import { parseId, withUser } from "@/lib/api/handler";
import { env } from "@/lib/env";
import type { PreviewJobOutput } from "@/lib/jobs/analysis-job";
import { runInWorker } from "@/lib/jobs/worker-pool";
import { toUploadError } from "@/lib/scans/job-error-response";
import { storage } from "@/lib/storage/file-storage";

export const dynamic = "force-dynamic";

// GET /api/scans/{id}/image – the analysed frame for display: little-endian float32 samples, at most 1024 px a side.
// Headers: x-width, x-height, x-scale (original pixels per sample), x-min, x-max.
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) => {
  const scan = await getScanDetail(parseId(params.id, "Scan"), user);
  const options = (scan.analysis?.options ?? {}) as { pixelSpacingMm?: { x: number; y: number } | null; frame?: number | null };
  const bytes = await storage().get(scan.storageKey);
  let out: PreviewJobOutput;
  try {
    out = (await runInWorker({ kind: "preview", bytes, pixelSpacingMm: options.pixelSpacingMm ?? null, frame: options.frame ?? null, maxPixels: env().MAX_IMAGE_PIXELS, maxSide: 1024 })) as PreviewJobOutput;
  } catch (err) {
    throw toUploadError(err);
  }
  return new Response(new Blob([out.data.buffer as ArrayBuffer]), {
    headers: {
      "content-type": "application/octet-stream",
      "cache-control": "private, max-age=3600",
      "x-width": String(out.width),
      "x-height": String(out.height),
      "x-scale": String(out.scale),
      "x-min": String(out.min),
      "x-max": String(out.max),
    },
  });
});
