import { acknowledgeAlert, getAlertDetail } from "@/db/queries/alert-workflow";
import { parseId, readOptionalJson, withUser } from "@/lib/api/handler";
import { acknowledgeAlertSchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// POST /api/alerts/{id}/acknowledge – the engineer (or physicist) takes the alert ({ note? })
export const POST = withUser<{ id: string }>("acknowledgeAlerts", async ({ req, user, params }) => {
  const id = parseId(params.id, "Alert");
  const { note } = acknowledgeAlertSchema.parse(await readOptionalJson(req));
  await acknowledgeAlert(id, user, note);
  return Response.json({ alert: await getAlertDetail(id, user) });
});
