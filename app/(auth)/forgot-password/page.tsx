import type { Metadata } from "next";
import { ForgotPasswordForm } from "./forgot-password-form";

export const metadata: Metadata = { title: "Forgot password" };

export default function ForgotPasswordPage() {
  return (
    <main className="flex min-h-screen items-start justify-center px-4 py-16 md:items-center">
      <div className="w-full max-w-md">
        <h1 className="text-display font-semibold tracking-tight">Halfmax</h1>
        <p className="mt-1 text-ink-muted">Reset your password.</p>
        <div className="mt-8 rounded-card border border-line bg-surface p-6 shadow-card">
          <ForgotPasswordForm />
        </div>
      </div>
    </main>
  );
}
