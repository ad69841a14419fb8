import { parseId, withUser } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { retryNow } from "@/lib/mail/outbox-sender";

export const dynamic = "force-dynamic";

// POST /api/admin/outbox/{id}/retry – put a failed or waiting message back at the front of the queue (admin)
export const POST = withUser<{ id: string }>("viewOutbox", async ({ params }) => {
  if (!(await retryNow(parseId(params.id, "Message")))) throw notFound("Pending or failed message");
  return Response.json({ ok: true });
});
