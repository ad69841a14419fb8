import { getAlertDetail, resolveAlert } from "@/db/queries/alert-workflow";
import { parseId, readJson, withUser } from "@/lib/api/handler";
import { resolveAlertSchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// POST /api/alerts/{id}/resolve – the physicist closes the alert after a passing re-test ({ note })
export const POST = withUser<{ id: string }>("resolveAlerts", async ({ req, user, params }) => {
  const id = parseId(params.id, "Alert");
  await getAlertDetail(id, user);
  const { note } = resolveAlertSchema.parse(await readJson(req));
  await resolveAlert(id, user, note);
  return Response.json({ alert: await getAlertDetail(id, user) });
});
