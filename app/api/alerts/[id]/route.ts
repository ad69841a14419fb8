import { getAlertDetail } from "@/db/queries/alert-workflow";
import { parseId, withUser } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

// GET /api/alerts/{id} – one alert with its service events
export const GET = withUser<{ id: string }>("viewFleet", async ({ user, params }) =>
  Response.json({ alert: await getAlertDetail(parseId(params.id, "Alert"), user) }),
);
