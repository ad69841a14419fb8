import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { hasDemoUsers } from "@/db/queries/users";
import { getSessionUser } from "@/lib/auth/request-user";
import { LoginForm } from "./login-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

const DEMO_ACCOUNTS = [
  { email: "physicist@halfmax.test", role: "Medical physicist" },
  { email: "lead@halfmax.test", role: "Department lead" },
  { email: "engineer@halfmax.test", role: "Service engineer" },
  { email: "admin@halfmax.test", role: "Administrator" },
];

export default async function LoginPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string }> }) {
  if (await getSessionUser()) redirect("/");
  const [{ callbackUrl }, demo] = await Promise.all([searchParams, hasDemoUsers().catch(() => false)]);
  const safeCallback = callbackUrl && callbackUrl.startsWith("/") && !callbackUrl.startsWith("//") ? callbackUrl : "/";
  return (
    <main className="flex min-h-screen items-start justify-center px-4 py-16 md:items-center">
      <div className="w-full max-w-md">
        <h1 className="text-display font-semibold tracking-tight">Halfmax</h1>
        <p className="mt-1 text-ink-muted">Resolution QA for your imaging fleet: FWHM, MTF and trends against each scanner&apos;s baseline.</p>
        <div className="mt-8 rounded-card border border-line bg-surface p-6 shadow-card">
          <LoginForm callbackUrl={safeCallback} />
        </div>
        {demo ? (
          <section aria-labelledby="demo-heading" className="mt-6 rounded-card border border-line bg-surface-sunken p-4" data-testid="demo-accounts">
            <h2 id="demo-heading" className="text-body font-semibold">Demo accounts</h2>
            <p className="text-caption text-ink-subtle">Fictional data of the Northmere Valley Health imaging group. Password for each: the demo password (default <code>halfmax-demo</code>).</p>
            <ul className="mt-2 space-y-1 text-caption">
              {DEMO_ACCOUNTS.map((a) => (
                <li key={a.email} className="flex justify-between gap-4">
                  <code>{a.email}</code>
                  <span className="text-ink-subtle">{a.role}</span>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        <p className="mt-6 text-caption text-ink-subtle">
          Results support, and never replace, the judgement of the qualified medical physicist.
        </p>
      </div>
    </main>
  );
}
