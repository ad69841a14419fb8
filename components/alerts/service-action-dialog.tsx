"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Callout, Field, FormDialog, Input, Textarea } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { serviceEventSchema } from "@/lib/validations/alert";
import { fromDateTimeLocal, toDateTimeLocal } from "@/lib/format/dates";
import { applyServerIssues, useAlertAction } from "./use-alert-action";

/** A few minutes of clock difference between the engineer's device and the server are tolerated. */
const FUTURE_SLACK_MS = 5 * 60_000;

/** The API schema, except that the form holds the browser's datetime-local text (local wall time) for performedAt. */
const serviceFormSchema = serviceEventSchema.extend({
  performedAt: z
    .string()
    .refine((v) => fromDateTimeLocal(v) !== null, { message: "Give the date and time of the service" })
    .refine((v) => (fromDateTimeLocal(v)?.getTime() ?? 0) <= Date.now() + FUTURE_SLACK_MS, { message: "The service cannot be in the future" }),
});
type ServiceFormValues = z.input<typeof serviceFormSchema>;
type ServiceFormOutput = z.output<typeof serviceFormSchema>;
type ServiceBody = { performedAt: string; description: string; parts: string };

/** Log what was done on the scanner for this alert (POST /api/alerts/{id}/service); logging also acknowledges an open alert. */
export function ServiceActionDialog({ alertId, subject, onClose }: { alertId: number; subject: string; onClose: () => void }) {
  const formId = useId();
  const [now] = useState(() => toDateTimeLocal(new Date()));
  const logService = useAlertAction<ServiceBody>(alertId, "service");
  const { register, handleSubmit, formState, setError } = useForm<ServiceFormValues, unknown, ServiceFormOutput>({
    resolver: zodResolver(serviceFormSchema),
    defaultValues: { performedAt: now, description: "", parts: "" },
  });
  const [fieldErrorsFromServer, setFieldErrorsFromServer] = useState(false);
  const pending = formState.isSubmitting || logService.isPending;

  const onSubmit = handleSubmit(async (values) => {
    setFieldErrorsFromServer(false);
    try {
      await logService.mutateAsync({ performedAt: fromDateTimeLocal(values.performedAt)!.toISOString(), description: values.description, parts: values.parts });
      onClose();
    } catch (err) {
      setFieldErrorsFromServer(applyServerIssues<ServiceFormValues>(err, ["performedAt", "description", "parts"], setError));
    }
  });

  return (
    <FormDialog
      open
      onClose={onClose}
      title="Log service action"
      description={`${subject}. The entry goes into the scanner's service log and this alert's timeline.`}
      formId={formId}
      pending={pending}
      submitLabel="Save service action"
      pendingLabel="Saving…"
    >
      <form id={formId} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <Field label="Performed at" required hint="Local time of this computer." error={formState.errors.performedAt?.message}>
          <Input type="datetime-local" className="max-w-60" max={now} {...register("performedAt")} />
        </Field>
        <Field label="What was done" required error={formState.errors.description?.message}>
          <Textarea rows={4} autoFocus placeholder="e.g. Detector recalibrated, focal spot measured, tube seasoning run" {...register("description")} />
        </Field>
        <Field label="Parts replaced" hint="Leave empty if none." error={formState.errors.parts?.message}>
          <Input autoComplete="off" placeholder="e.g. Collimator blade assembly, part no. 4471-02" {...register("parts")} />
        </Field>
        {logService.error && !fieldErrorsFromServer ? (
          <Callout tone="error" title="The service action was not saved">
            {errorMessage(logService.error)}
          </Callout>
        ) : null}
      </form>
    </FormDialog>
  );
}
