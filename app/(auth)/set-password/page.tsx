import type { Metadata } from "next";
import Link from "next/link";
import { Callout } from "@/components/ui/callout";
import { SetPasswordForm } from "./set-password-form";

export const metadata: Metadata = { title: "Choose a password" };

export default async function SetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const { token: raw } = await searchParams;
  const token = typeof raw === "string" ? raw.trim() : "";
  return (
    <main className="flex min-h-screen items-start justify-center px-4 py-16 md:items-center">
      <div className="w-full max-w-md">
        <h1 className="text-display font-semibold tracking-tight">Halfmax</h1>
        <p className="mt-1 text-ink-muted">Choose the password for your account.</p>
        <div className="mt-8 rounded-card border border-line bg-surface p-6 shadow-card">
          {token ? (
            <SetPasswordForm token={token} />
          ) : (
            <div className="flex flex-col gap-4">
              <Callout tone="error" role="note" title="This link is incomplete">
                Open the link from your invitation or password-reset e-mail exactly as it was sent. If it has expired, request a new one.
              </Callout>
              <Link href="/forgot-password" className="text-caption text-accent underline-offset-2 hover:underline">
                Request a new link
              </Link>
            </div>
          )}
        </div>
        <p className="mt-6 text-caption">
          <Link href="/login" className="text-accent underline-offset-2 hover:underline">
            Back to sign in
          </Link>
        </p>
      </div>
    </main>
  );
}
