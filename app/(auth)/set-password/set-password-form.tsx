"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Button, buttonClasses } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { passwordSchema } from "@/lib/validations/user";

const setPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: "The two passwords do not match", path: ["confirm"] });
type SetPasswordInput = z.infer<typeof setPasswordSchema>;

/** New password + confirmation → POST /api/password/set with the invitation or reset token from the link. */
export function SetPasswordForm({ token }: { token: string }) {
  const [done, setDone] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<SetPasswordInput>({
    resolver: zodResolver(setPasswordSchema),
    defaultValues: { password: "", confirm: "" },
  });

  const onSubmit = handleSubmit(async ({ password }) => {
    setFailure(null);
    try {
      await fetchJson("/api/password/set", { method: "POST", body: { token, password } });
      setDone(true);
    } catch (err) {
      setFailure(errorMessage(err));
    }
  });

  if (done) {
    return (
      <div className="flex flex-col gap-4">
        <Callout tone="success" role="status" title="Your password is set">
          Sign in with your e-mail address and the new password.
        </Callout>
        <Link href="/login" className={buttonClasses({ fullWidth: true })}>
          Go to sign in
        </Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <Field label="New password" hint="At least 10 characters. A short sentence is easy to remember and hard to guess." error={formState.errors.password?.message}>
        <Input type="password" autoComplete="new-password" autoFocus {...register("password")} />
      </Field>
      <Field label="Confirm password" error={formState.errors.confirm?.message}>
        <Input type="password" autoComplete="new-password" {...register("confirm")} />
      </Field>
      {failure ? (
        <div role="alert" className="flex flex-col gap-1 rounded-control border border-act-line bg-act-soft px-3 py-2 text-act">
          <p>{failure}</p>
          <Link href="/forgot-password" className="text-caption font-medium underline underline-offset-2">
            Request a new link
          </Link>
        </div>
      ) : null}
      <Button type="submit" loading={formState.isSubmitting} loadingText="Saving…" fullWidth>
        Set password
      </Button>
    </form>
  );
}
