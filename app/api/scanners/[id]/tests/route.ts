import { getFleetStatus } from "@/db/queries/fleet";
import { listTestsForScanner, putTests } from "@/db/queries/qa";
import { readJson, withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { putTestsSchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";

async function testsWithDue(scannerId: number) {
  const [tests, status] = await Promise.all([listTestsForScanner(scannerId), getFleetStatus([scannerId])]);
  const due = new Map((status.get(scannerId)?.tests ?? []).map((t) => [t.testId, t]));
  return tests.map((t) => ({ ...t, schedule: due.get(t.id) ?? null }));
}

// GET /api/scanners/{id}/tests – the scanner's routine tests with frequency, last result, due and overdue state
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) => {
  const scanner = await scannerFromParams(params, user);
  return Response.json({ tests: await testsWithDue(scanner.id) });
});

// PUT /api/scanners/{id}/tests – create or update routine tests and their schedules ({ tests: [...] }) (physicist, admin)
export const PUT = withUser<{ id: string }>("manageSchedules", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const { tests } = putTestsSchema.parse(await readJson(req));
  await putTests(scanner.id, tests, user.id);
  return Response.json({ tests: await testsWithDue(scanner.id) });
});
