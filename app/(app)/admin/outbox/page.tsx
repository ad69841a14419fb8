// GET /admin/outbox – e-mail outbox for administrators: delivery states, previews, retry, and a test message
import type { Metadata } from "next";
import { OutboxTable, TestMailForm } from "@/components/admin/outbox-table";
import { Card, CardBody, CardDescription, CardHeader, CardTitle, PageHeader } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { env } from "@/lib/env";
import { MAX_ATTEMPTS } from "@/lib/qa/retry";

export const metadata: Metadata = { title: "Outbox" };

/** Where this server sends mail, without user name or password: "smtp://mail.example.org:587". */
function smtpTarget(url: string | undefined): string | null {
  if (!url) return null;
  try {
    const u = new URL(url);
    return `${u.protocol}//${u.hostname}${u.port ? `:${u.port}` : ""}`;
  } catch {
    return "an SMTP_URL that is not a valid URL";
  }
}

export default async function OutboxPage() {
  const admin = await requirePagePermission("viewOutbox");
  const { HALFMAX_ENV, SMTP_URL, MAIL_FROM } = env();
  const target = smtpTarget(SMTP_URL);
  const senderOff = process.env.HALFMAX_BACKGROUND_JOBS === "0";

  return (
    <div className="space-y-6">
      <PageHeader
        title="Outbox"
        description={`Every e-mail Halfmax sends — alert notices, daily digests, invitations, password resets and test messages — is queued here first, in the same transaction as the change it reports, and delivered by the server's sender within seconds. A failed delivery is retried with growing delays (up to ${MAX_ATTEMPTS} attempts over a few hours), then marked failed.`}
      />

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card aria-labelledby="test-mail-title">
          <CardHeader>
            <CardTitle id="test-mail-title">Send a test message</CardTitle>
            <CardDescription>
              The test message goes through the same outbox and sender as alert e-mails, so its row below shows whether outgoing mail works.
            </CardDescription>
          </CardHeader>
          <CardBody>
            <TestMailForm defaultTo={admin.email} />
          </CardBody>
        </Card>

        <Card tone="sunken" aria-labelledby="mail-route-title">
          <CardHeader>
            <CardTitle id="mail-route-title">Where mail goes</CardTitle>
          </CardHeader>
          <CardBody className="space-y-3 text-body text-ink-muted">
            <p>
              This server ({HALFMAX_ENV} environment) sends through{" "}
              {target ? <code className="rounded-chip bg-surface px-1 py-0.5 text-ink">{target}</code> : <strong className="text-ink">no SMTP server: SMTP_URL is not set, so messages stay pending</strong>}{" "}
              as <span className="text-ink">{MAIL_FROM}</span>.
            </p>
            {senderOff ? (
              <p>
                <strong className="text-ink">The sender is switched off in this server process</strong> (HALFMAX_BACKGROUND_JOBS=0): messages stay pending
                until another Halfmax server delivers them.
              </p>
            ) : null}
            <p>
              In development and tests (<code>npm start</code>, <code>npm test</code>) mail goes to the local SMTP sink, which accepts every message
              and sends nothing on: each one is also kept as a file in <code className="text-ink">.data/&lt;env&gt;/mail/*.eml</code> (open it with any
              mail program). In production, set <code>SMTP_URL</code> to your mail relay and <code>MAIL_FROM</code> to a sender it accepts.
            </p>
          </CardBody>
        </Card>
      </div>

      <section aria-labelledby="outbox-title" className="space-y-3">
        <h2 id="outbox-title" className="text-title font-semibold text-ink">
          Messages
        </h2>
        <OutboxTable />
      </section>
    </div>
  );
}
