import { listAlerts } from "@/db/queries/alert-workflow";
import { withUser } from "@/lib/api/handler";
import { listAlertsQuerySchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// GET /api/alerts?state=open|acknowledged|resolved|active&cause=&scannerId= – alerts the caller may see (engineers: assigned scanners)
export const GET = withUser("viewFleet", async ({ req, user }) => {
  const q = listAlertsQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ alerts: await listAlerts(user, q) });
});
