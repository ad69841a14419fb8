import { deleteScan, getScanDetail, isStorageKeyReferenced } from "@/db/queries/scans";
import { db } from "@/db/client";
import { parseId, withUser } from "@/lib/api/handler";
import { scanToJson } from "@/lib/scans/scan-json";
import { storage } from "@/lib/storage/file-storage";

export const dynamic = "force-dynamic";
type Params = { id: string };

// GET /api/scans/{id} – one scan with its current analysis (metrics, curves, evaluation) and analysis history
export const GET = withUser<Params>("viewFleet", async ({ user, params }) =>
  Response.json(scanToJson(await getScanDetail(parseId(params.id, "Scan"), user))),
);

// DELETE /api/scans/{id} – delete a scan and its analyses (admin; recorded in the audit log)
export const DELETE = withUser<Params>("deleteScans", async ({ user, params }) => {
  const { storageKey } = await deleteScan(parseId(params.id, "Scan"), user);
  if (!(await isStorageKeyReferenced(db(), storageKey))) await storage().delete(storageKey);
  return Response.json({ ok: true });
});
