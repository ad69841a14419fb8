import { listOutbox } from "@/db/queries/outbox";
import { withUser } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

// GET /api/admin/outbox – the latest queued, sent and failed e-mails with attempts and last error (admin)
export const GET = withUser("viewOutbox", async () => Response.json({ messages: await listOutbox(200) }));
