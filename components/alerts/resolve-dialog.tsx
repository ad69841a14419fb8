"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useId } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Callout, Field, FormDialog, Textarea } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { resolveAlertSchema } from "@/lib/validations/alert";
import { formatDateTime } from "@/lib/format/dates";
import { useAlertAction } from "./use-alert-action";

type ResolveValues = z.input<typeof resolveAlertSchema>;
type ResolveInput = z.output<typeof resolveAlertSchema>;

export interface ResolveDialogProps {
  alertId: number;
  subject: string;
  /** The result that proposed resolution (a passing re-test, or the overdue test done), if any. */
  retest: { scanId: number | null; at: string | null; what: "Re-test passed" | "Test done" };
  onClose: () => void;
}

/** The physicist closes the alert with a note (POST /api/alerts/{id}/resolve); the note is kept with the alert. */
export function ResolveDialog({ alertId, subject, retest, onClose }: ResolveDialogProps) {
  const formId = useId();
  const resolve = useAlertAction<ResolveInput>(alertId, "resolve");
  const { register, handleSubmit, formState } = useForm<ResolveValues, unknown, ResolveInput>({
    resolver: zodResolver(resolveAlertSchema),
    defaultValues: { note: "" },
  });
  const pending = formState.isSubmitting || resolve.isPending;
  const onSubmit = handleSubmit(async (values) => {
    try {
      await resolve.mutateAsync(values);
      onClose();
    } catch {
      // shown below from resolve.error
    }
  });

  return (
    <FormDialog
      open
      onClose={onClose}
      title="Resolve alert"
      description={`${subject}. Resolving closes the alert; a later failing result opens a new one.`}
      formId={formId}
      pending={pending}
      submitLabel="Resolve alert"
      pendingLabel="Resolving…"
    >
      <form id={formId} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {retest.scanId ? (
          <p className="text-body text-ink-muted">
            {retest.what} {formatDateTime(retest.at)}:{" "}
            <Link href={`/scans/${retest.scanId}`} className="font-medium text-accent underline underline-offset-2">
              open the result
            </Link>{" "}
            to check it before you close the alert.
          </p>
        ) : null}
        <Field label="Resolution note" required hint="How the alert was closed, e.g. “Re-test passed after detector recalibration”." error={formState.errors.note?.message}>
          <Textarea rows={3} autoFocus {...register("note")} />
        </Field>
        {resolve.error ? (
          <Callout tone="error" title="The alert was not resolved">
            {errorMessage(resolve.error)}
          </Callout>
        ) : null}
      </form>
    </FormDialog>
  );
}
