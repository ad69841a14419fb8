"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useId } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Callout, Field, FormDialog, Textarea } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { acknowledgeAlertSchema } from "@/lib/validations/alert";
import { useAlertAction } from "./use-alert-action";

type AcknowledgeValues = z.input<typeof acknowledgeAlertSchema>;
type AcknowledgeInput = z.output<typeof acknowledgeAlertSchema>;

/** "I have seen this and I am on it": POST /api/alerts/{id}/acknowledge with an optional note (kept in the audit trail). */
export function AcknowledgeDialog({ alertId, subject, onClose }: { alertId: number; subject: string; onClose: () => void }) {
  const formId = useId();
  const acknowledge = useAlertAction<AcknowledgeInput>(alertId, "acknowledge");
  const { register, handleSubmit, formState } = useForm<AcknowledgeValues, unknown, AcknowledgeInput>({
    resolver: zodResolver(acknowledgeAlertSchema),
    defaultValues: { note: "" },
  });
  const pending = formState.isSubmitting || acknowledge.isPending;
  const onSubmit = handleSubmit(async ({ note }) => {
    try {
      await acknowledge.mutateAsync(note ? { note } : {});
      onClose();
    } catch {
      // shown below from acknowledge.error
    }
  });

  return (
    <FormDialog
      open
      size="sm"
      onClose={onClose}
      title="Acknowledge alert"
      description={`${subject}. Acknowledging tells the physicist and the other engineers that you are dealing with it.`}
      formId={formId}
      pending={pending}
      submitLabel="Acknowledge alert"
      pendingLabel="Acknowledging…"
    >
      <form id={formId} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <Field label="Note" hint="Optional, e.g. when you expect to be on site. Kept in the audit trail." error={formState.errors.note?.message}>
          <Textarea rows={3} autoFocus {...register("note")} />
        </Field>
        {acknowledge.error ? (
          <Callout tone="error" title="The alert was not acknowledged">
            {errorMessage(acknowledge.error)}
          </Callout>
        ) : null}
      </form>
    </FormDialog>
  );
}
