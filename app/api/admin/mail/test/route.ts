import { db } from "@/db/client";
import { insertAuditEvent } from "@/db/queries/audit";
import { enqueueMail } from "@/db/queries/outbox";
import { readJson, withUser } from "@/lib/api/handler";
import { layoutHtml } from "@/lib/mail/templates";
import { testMailSchema } from "@/lib/validations/alert";

export const dynamic = "force-dynamic";

// POST /api/admin/mail/test – queue a test message to { "to": "…" } through the outbox to check the SMTP configuration (admin)
export const POST = withUser("sendTestMail", async ({ req, user }) => {
  const { to } = testMailSchema.parse(await readJson(req));
  const at = new Date().toISOString();
  const subject = "[Halfmax] Test message";
  const text = `This is a test message from Halfmax, queued by ${user.name} at ${at}.\nIf you can read it, outgoing e-mail works.\n`;
  await db().transaction(async (tx) => {
    await enqueueMail(tx, { kind: "test", to, subject, text, html: layoutHtml("Test message", `<p>Queued by ${user.name} at ${at}.</p><p>If you can read it, outgoing e-mail works.</p>`) });
    await insertAuditEvent(tx, { actorUserId: user.id, action: "mail.test", entityType: "mail", entityId: to, details: { to } });
  });
  return Response.json({ queued: true, to, message: "Queued: it is delivered within seconds; see the Outbox page for its state." }, { status: 202 });
});
