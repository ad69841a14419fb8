import { listServiceEvents, logServiceEvent } from "@/db/queries/alert-workflow";
import { readJson, withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { serviceEventSchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// GET /api/scanners/{id}/service-events – the scanner's service log, newest first
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) => {
  const scanner = await scannerFromParams(params, user);
  return Response.json({ serviceEvents: await listServiceEvents(scanner.id) });
});

// POST /api/scanners/{id}/service-events – log a service action not tied to an alert ({ performedAt, description, parts })
export const POST = withUser<{ id: string }>("logService", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const created = await logServiceEvent(scanner.id, serviceEventSchema.parse(await readJson(req)), user);
  return Response.json(created, { status: 201 });
});
