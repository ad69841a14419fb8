import type { Metadata } from "next";
import { ApiTokens } from "@/components/account/api-tokens";
import { MailPreferenceForm } from "@/components/account/mail-preference-form";
import { Card, CardBody, CardDescription, CardHeader, CardTitle } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { getUserById } from "@/db/queries/users";
import { requireUser } from "@/lib/auth/page-guards";
import { ROLE_LABELS } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Account & tokens" };

export default async function AccountPage() {
  const sessionUser = await requireUser();
  const user = await getUserById(sessionUser.id);
  const mailPreference = user?.mailPreference ?? "immediate";
  return (
    <div className="flex max-w-4xl flex-col gap-6">
      <PageHeader title="Account & tokens" description="Your details, how Halfmax e-mails you, and personal tokens for the API." />

      <Card aria-labelledby="account-details">
        <CardHeader>
          <CardTitle id="account-details">Your account</CardTitle>
          <CardDescription>To change your name, e-mail address or role, ask an administrator.</CardDescription>
        </CardHeader>
        <CardBody>
          <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[10rem_1fr]">
            <dt className="text-ink-muted">Name</dt>
            <dd className="font-medium">{sessionUser.name}</dd>
            <dt className="text-ink-muted">E-mail</dt>
            <dd>{sessionUser.email}</dd>
            <dt className="text-ink-muted">Role</dt>
            <dd>{ROLE_LABELS[sessionUser.role]}</dd>
          </dl>
        </CardBody>
      </Card>

      <Card aria-labelledby="account-mail">
        <CardHeader>
          <CardTitle id="account-mail">Alert e-mails</CardTitle>
          <CardDescription>Alerts open when a result exceeds its tolerance, a test is overdue or a trend drifts.</CardDescription>
        </CardHeader>
        <CardBody>
          <MailPreferenceForm initial={mailPreference} />
        </CardBody>
      </Card>

      <Card aria-labelledby="account-tokens">
        <CardHeader>
          <CardTitle id="account-tokens">Personal API tokens</CardTitle>
        </CardHeader>
        <CardBody flush>
          <ApiTokens />
        </CardBody>
      </Card>
    </div>
  );
}
