"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";

const forgotSchema = z.object({ email: z.string().trim().email({ message: "Enter your e-mail address" }) });
type ForgotInput = z.infer<typeof forgotSchema>;

/** E-mail → POST /api/password/reset → the same neutral confirmation whether or not the account exists. */
export function ForgotPasswordForm() {
  const [sent, setSent] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<ForgotInput>({ resolver: zodResolver(forgotSchema) });

  const onSubmit = handleSubmit(async ({ email }) => {
    setFailure(null);
    try {
      const res = await fetchJson<{ message?: string }>("/api/password/reset", { method: "POST", body: { email } });
      setSent(res.message ?? "If that address has an account, a reset link is on its way.");
    } catch (err) {
      setFailure(errorMessage(err));
    }
  });

  if (sent) {
    return (
      <div className="flex flex-col gap-4">
        <Callout tone="success" role="status" title="Check your inbox">
          {sent} The link works for 2 hours and only once. Nothing arriving? Check the spam folder, or ask an administrator.
        </Callout>
        <Link href="/login" className="text-caption text-accent underline-offset-2 hover:underline">
          Back to sign in
        </Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <p className="text-body text-ink-muted">Enter the e-mail address of your Halfmax account. We send a link to choose a new password.</p>
      <Field label="E-mail" error={formState.errors.email?.message}>
        <Input type="email" autoComplete="username" autoFocus {...register("email")} />
      </Field>
      {failure ? (
        <p role="alert" className="rounded-control border border-act-line bg-act-soft px-3 py-2 text-act">
          {failure}
        </p>
      ) : null}
      <Button type="submit" loading={formState.isSubmitting} loadingText="Sending…" fullWidth>
        Send reset link
      </Button>
      <Link href="/login" className="text-caption text-accent underline-offset-2 hover:underline">
        Back to sign in
      </Link>
    </form>
  );
}
