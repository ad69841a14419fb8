"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useId } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import type { z } from "zod";
import { Button, Field, FormDialog, Input, Select, Textarea } from "@/components/ui";
import { ServerError } from "@/components/admin/server-error";
import { putTestsSchema } from "@/lib/validations/qa";
import { FREQUENCY_LABELS, METHOD_NAMES } from "./qa-format";
import { putJson, qaKeys, type Frequency, type MethodName, type QaTestJson } from "./qa-types";

type FormIn = z.input<typeof putTestsSchema>;
type FormOut = z.output<typeof putTestsSchema>;

const FREQUENCIES = Object.keys(FREQUENCY_LABELS) as Frequency[];
const METHODS = Object.keys(METHOD_NAMES) as MethodName[];
const BLANK_TEST = { name: "", method: "edge", phantom: "", protocol: "", frequency: "weekly", active: true } as const satisfies FormIn["tests"][number];

/**
 * Edit the scanner's routine tests and their frequencies (PUT /api/scanners/{id}/tests), or add one. Tests are
 * never deleted, so their history stays: untick "Active" to retire one. The form mounts fresh each time it opens.
 */
export function ScheduleDialog({ scannerId, tests, open, onClose }: { scannerId: number; tests: QaTestJson[]; open: boolean; onClose: () => void }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const save = useMutation({
    mutationFn: (input: FormOut) => putJson(`/api/scanners/${scannerId}/tests`, input),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: qaKeys.all });
      onClose();
    },
  });
  const { reset } = save;
  useEffect(() => {
    if (open) reset();
  }, [open, reset]);
  const pending = save.isPending;

  return (
    <FormDialog
      open={open}
      size="lg"
      onClose={onClose}
      title="Routine tests and schedule"
      description="What is measured on this scanner and how often. Due dates count from each test's last result."
      formId={formId}
      pending={pending}
      submitLabel="Save schedule"
      pendingLabel="Saving…"
    >
      <ScheduleForm formId={formId} tests={tests} onSubmit={(v) => save.mutateAsync(v).then(() => undefined, () => undefined)} error={save.error} />
    </FormDialog>
  );
}

function ScheduleForm({ formId, tests, onSubmit, error }: { formId: string; tests: QaTestJson[]; onSubmit: (v: FormOut) => Promise<void>; error: unknown }) {
  const { register, control, handleSubmit, formState } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(putTestsSchema),
    defaultValues: {
      tests: tests.length
        ? tests.map((t) => ({ id: t.id, name: t.name, method: t.method, phantom: t.phantom, protocol: t.protocol, frequency: t.frequency, active: t.active }))
        : [BLANK_TEST],
    },
  });
  // keyName "key": the tests carry their own database `id`, which must reach the server untouched.
  const { fields, append } = useFieldArray({ control, name: "tests", keyName: "key" });
  const errors = formState.errors.tests;

  return (
    <form id={formId} noValidate onSubmit={handleSubmit(onSubmit)} className="flex flex-col gap-4">
      {fields.map((f, i) => (
        <fieldset key={f.key} className="flex flex-col gap-3 rounded-card border border-line p-4">
          <legend className="px-1 text-body font-semibold text-ink">{f.name || "New test"}</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            <Field label="Name" required error={errors?.[i]?.name?.message}>
              <Input autoComplete="off" {...register(`tests.${i}.name`)} />
            </Field>
            <Field label="Frequency" required error={errors?.[i]?.frequency?.message}>
              <Select {...register(`tests.${i}.frequency`)}>
                {FREQUENCIES.map((fr) => (
                  <option key={fr} value={fr}>{FREQUENCY_LABELS[fr]}</option>
                ))}
              </Select>
            </Field>
            <Field
              label="Method"
              required
              hint={i < tests.length ? "Keep the method of a test that has results; add a new test for another method." : undefined}
              error={errors?.[i]?.method?.message}
            >
              <Select {...register(`tests.${i}.method`)}>
                {METHODS.map((m) => (
                  <option key={m} value={m}>{METHOD_NAMES[m]}</option>
                ))}
              </Select>
            </Field>
            <Field label="Phantom" error={errors?.[i]?.phantom?.message}>
              <Input autoComplete="off" placeholder="e.g. 0.28 mm tungsten-carbide bead" {...register(`tests.${i}.phantom`)} />
            </Field>
          </div>
          <Field label="Protocol" hint="Acquisition and reconstruction settings, so every repeat is comparable." error={errors?.[i]?.protocol?.message}>
            <Textarea rows={2} {...register(`tests.${i}.protocol`)} />
          </Field>
          <label className="flex items-center gap-2 text-body text-ink">
            <input type="checkbox" className="size-4 accent-accent" {...register(`tests.${i}.active`)} />
            Active (retired tests keep their results but are no longer scheduled)
          </label>
        </fieldset>
      ))}
      <div>
        <Button
          variant="secondary"
          size="sm"
          onClick={() => append(BLANK_TEST)}
          disabled={fields.length >= 20}
        >
          Add a test
        </Button>
      </div>
      {errors?.message ? <p className="text-caption font-medium text-act">{errors.message}</p> : null}
      <ServerError error={error} title="The schedule was not saved" />
    </form>
  );
}
