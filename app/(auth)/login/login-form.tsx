"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

const signInSchema = z.object({
  email: z.string().trim().email({ message: "Enter your e-mail address" }),
  password: z.string().min(1, { message: "Enter your password" }),
});
type SignInInput = z.infer<typeof signInSchema>;

export function LoginForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  // Marks the form as interactive once React has hydrated it (used by the browser tests before they type).
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  const { register, handleSubmit, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    const res = await signIn("credentials", { ...values, redirect: false });
    if (!res || res.error) {
      setFailure("E-mail or password is not right, or the account is deactivated.");
      return;
    }
    router.replace(callbackUrl);
    router.refresh();
  });

  return (
    <form
      onSubmit={onSubmit}
      method="post"
      noValidate
      data-hydrated={hydrated ? "true" : undefined}
      className="flex flex-col gap-4"
      aria-describedby={failure ? "login-failure" : undefined}
    >
      <Field label="E-mail" error={formState.errors.email?.message}>
        <Input type="email" autoComplete="username" autoFocus {...register("email")} />
      </Field>
      <Field label="Password" error={formState.errors.password?.message}>
        <Input type="password" autoComplete="current-password" {...register("password")} />
      </Field>
      {failure ? (
        <p id="login-failure" role="alert" className="rounded-control border border-act-line bg-act-soft px-3 py-2 text-act">
          {failure}
        </p>
      ) : null}
      <Button type="submit" loading={formState.isSubmitting} loadingText="Signing in…" fullWidth>
        Sign in
      </Button>
      <Link href="/forgot-password" className="text-caption text-accent underline-offset-2 hover:underline">
        Forgot your password?
      </Link>
    </form>
  );
}
