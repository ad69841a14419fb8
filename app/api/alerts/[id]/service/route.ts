import { getAlertDetail, logServiceEvent } from "@/db/queries/alert-workflow";
import { parseId, readJson, withUser } from "@/lib/api/handler";
import { serviceEventSchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// POST /api/alerts/{id}/service – log a service action against the alert ({ performedAt, description, parts })
export const POST = withUser<{ id: string }>("logService", async ({ req, user, params }) => {
  const id = parseId(params.id, "Alert");
  const alert = await getAlertDetail(id, user);
  const input = serviceEventSchema.parse(await readJson(req));
  const { id: serviceEventId } = await logServiceEvent(alert.scannerId, input, user, id);
  return Response.json({ serviceEventId, alert: await getAlertDetail(id, user) }, { status: 201 });
});
