"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useId } from "react";
import { useForm, useWatch } from "react-hook-form";
import { Field, FormDialog, Input, Select } from "@/components/ui";
import { ServerError } from "@/components/admin/server-error";
import { METRICS } from "@/lib/qa/metrics";
import { toleranceSchema, type ToleranceInput } from "@/lib/validations/qa";
import { directionText } from "./qa-format";
import { putJson, qaKeys, type ToleranceRowJson } from "./qa-types";

/**
 * Edit the warning and action levels of one test × metric (PUT /api/scanners/{id}/tolerances, validated with the
 * same toleranceSchema as the server). Open while `row` is set; the form mounts fresh each time it opens. Stored
 * statuses are re-evaluated by the server on save.
 */
export function ToleranceDialog({ scannerId, testName, row, onClose, onSaved }: { scannerId: number; testName: string; row: ToleranceRowJson | null; onClose: () => void; onSaved: (text: string) => void }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const save = useMutation({
    mutationFn: (input: ToleranceInput) => putJson(`/api/scanners/${scannerId}/tolerances`, { tolerances: [input] }),
    onSuccess: async (_r, input) => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: qaKeys.all }), queryClient.invalidateQueries({ queryKey: ["scans"] })]);
      const label = input.metric in METRICS ? METRICS[input.metric as keyof typeof METRICS].label : input.metric;
      onSaved(`${label} levels for “${testName}” saved; statuses were re-evaluated.`);
    },
  });
  const { reset } = save;
  useEffect(() => {
    if (row) reset(); // no stale error from an earlier attempt
  }, [row, reset]);
  const pending = save.isPending;
  const label = row ? METRICS[row.metric].label : "";

  return (
    <FormDialog
      open={row !== null}
      onClose={onClose}
      title={`${label} tolerance`}
      description={`${testName}. Two tiers: a warning level (investigate) and an action level (act; consider taking the scanner out of use).`}
      formId={formId}
      pending={pending}
      submitLabel="Save levels"
      pendingLabel="Saving…"
    >
      {row ? <ToleranceForm key={`${row.testId}-${row.metric}`} formId={formId} row={row} onSubmit={(v) => save.mutateAsync(v).then(() => undefined, () => undefined)} error={save.error} /> : null}
    </FormDialog>
  );
}

function ToleranceForm({ formId, row, onSubmit, error }: { formId: string; row: ToleranceRowJson; onSubmit: (v: ToleranceInput) => Promise<void>; error: unknown }) {
  const def = METRICS[row.metric];
  const { register, control, handleSubmit, formState } = useForm<ToleranceInput>({
    // Same schema as the server; only an empty number box gets friendlier words than "expected number, received NaN".
    resolver: zodResolver(toleranceSchema, { error: (issue) => (issue.code === "invalid_type" && issue.expected === "number" ? "Enter a number" : undefined) }),
    defaultValues: {
      testId: row.testId,
      metric: row.metric,
      mode: row.mode,
      warning: row.warning,
      action: row.action,
      // A default's long explanation is not a source for levels someone chose: ask for one.
      source: row.isDefault ? "" : row.source,
    },
  });
  const mode = useWatch({ control, name: "mode" });
  const unit = mode === "relative" ? "%" : def.unit || "(ratio)";
  const levelHint =
    mode === "relative"
      ? `Percent worse than the baseline mean (${directionText(row.metric)}).`
      : `In ${def.unit || "MTF units (0–1)"}; ${def.direction === "lower-is-worse" ? "lower is worse, so the warning level lies above the action level" : "higher is worse, so the warning level lies below the action level"}.`;
  const e = formState.errors;

  return (
    <form id={formId} noValidate onSubmit={handleSubmit(onSubmit)} className="flex flex-col gap-4">
      <Field label="Mode" error={e.mode?.message}>
        <Select {...register("mode")}>
          <option value="relative">Relative to the baseline (%)</option>
          <option value="absolute">Absolute ({def.unit || "MTF value"})</option>
        </Select>
      </Field>
      <p className="-mt-2 text-caption text-ink-subtle">{levelHint}</p>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label={`Warning level (${unit})`} required error={e.warning?.message}>
          <Input type="number" step="any" inputMode="decimal" suffix={unit} {...register("warning", { valueAsNumber: true })} />
        </Field>
        <Field label={`Action level (${unit})`} required error={e.action?.message}>
          <Input type="number" step="any" inputMode="decimal" suffix={unit} {...register("action", { valueAsNumber: true })} />
        </Field>
      </div>
      <Field
        label="Source"
        required
        hint={
          row.isDefault
            ? `Where these numbers come from: a standard, the manufacturer's specification, or “local decision”. The default's basis was: ${row.source}`
            : "Where these numbers come from: a standard, the manufacturer's specification, or “local decision”."
        }
        error={e.source?.message}
      >
        <Input autoComplete="off" placeholder="e.g. local decision, QA programme 2026" {...register("source")} />
      </Field>
      <ServerError error={error} title="The levels were not saved" />
    </form>
  );
}
