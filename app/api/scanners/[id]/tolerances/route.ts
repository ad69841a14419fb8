import { listTolerances, putTolerances } from "@/db/queries/qa";
import { readJson, withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { putTolerancesSchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";

// GET /api/scanners/{id}/tolerances – warning and action levels per test × metric (stored, or the modality default with its source)
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) => {
  const scanner = await scannerFromParams(params, user);
  return Response.json({ tolerances: await listTolerances(scanner.id, scanner.modality) });
});

// PUT /api/scanners/{id}/tolerances – set levels ({ tolerances: [{ testId, metric, mode, warning, action, source }] }); statuses are re-evaluated (physicist)
export const PUT = withUser<{ id: string }>("manageTolerances", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const { tolerances } = putTolerancesSchema.parse(await readJson(req));
  await putTolerances(scanner.id, scanner.modality, tolerances, user.id);
  return Response.json({ tolerances: await listTolerances(scanner.id, scanner.modality) });
});
