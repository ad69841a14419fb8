"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useId, useMemo } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { Button, Callout, Field, FormDialog, Select, SkeletonText, StatusBadge, Textarea } from "@/components/ui";
import { ServerError } from "@/components/admin/server-error";
import { errorMessage } from "@/lib/api/fetch-json";
import { createBaselineSchema, type CreateBaselineInput } from "@/lib/validations/qa";
import { formatDate, formatValueWithUnit } from "./qa-format";
import { putJson, qaKeys, type QaTestJson } from "./qa-types";
import { useScannerScans } from "./use-scanner-queries";

const ALL_TIME = { from: "", to: "" };
const QUICK_PICK = 10;

/**
 * Set a new baseline for one test from results the physicist ticks (PUT /api/scanners/{id}/baselines): mean and SD
 * per metric; the previous baseline is kept as history and every stored status is re-evaluated at once. The form
 * mounts fresh each time the dialog opens.
 */
export function BaselineDialog({ scannerId, tests, open, onClose, onSaved }: { scannerId: number; tests: QaTestJson[]; open: boolean; onClose: () => void; onSaved: (text: string) => void }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const save = useMutation({
    mutationFn: (input: CreateBaselineInput) => putJson(`/api/scanners/${scannerId}/baselines`, input),
    onSuccess: async (_r, input) => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: qaKeys.all }), queryClient.invalidateQueries({ queryKey: ["scans"] })]);
      const name = tests.find((t) => t.id === input.testId)?.name ?? "the test";
      onSaved(`New baseline for “${name}” from ${input.scanIds.length} ${input.scanIds.length === 1 ? "result" : "results"}; statuses were re-evaluated.`);
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
      title="Set a new baseline"
      description="Tick results taken under stable, verified conditions (e.g. at acceptance or after major service). The baseline in force now is kept in the history."
      formId={formId}
      pending={pending}
      submitLabel="Set baseline"
      pendingLabel="Setting…"
    >
      <BaselineForm formId={formId} scannerId={scannerId} tests={tests} onSubmit={(v) => save.mutateAsync(v).then(() => undefined, () => undefined)} error={save.error} />
    </FormDialog>
  );
}

function BaselineForm({ formId, scannerId, tests, onSubmit, error }: { formId: string; scannerId: number; tests: QaTestJson[]; onSubmit: (v: CreateBaselineInput) => Promise<void>; error: unknown }) {
  const listId = useId();
  const scans = useScannerScans(scannerId, ALL_TIME);
  const { register, control, handleSubmit, formState, setValue } = useForm<CreateBaselineInput>({
    resolver: zodResolver(createBaselineSchema),
    defaultValues: { testId: tests.find((t) => t.active)?.id ?? tests[0]?.id, scanIds: [], reason: "" },
  });
  const testId = useWatch({ control, name: "testId" });
  const candidates = useMemo(() => (scans.data?.scans ?? []).filter((s) => s.testId === testId), [scans.data, testId]);

  return (
    <form id={formId} noValidate onSubmit={handleSubmit(onSubmit)} className="flex flex-col gap-4">
      <Field label="Test" required error={formState.errors.testId?.message}>
        <Select {...register("testId", { valueAsNumber: true, onChange: () => setValue("scanIds", []) })}>
          {tests.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
              {t.active ? "" : " (retired)"}
            </option>
          ))}
        </Select>
      </Field>

      <Controller
        control={control}
        name="scanIds"
        render={({ field, fieldState }) => {
          const set = new Set(field.value);
          const toggle = (id: number, on: boolean) => field.onChange(on ? [...field.value, id] : field.value.filter((x) => x !== id));
          return (
            <fieldset className="flex flex-col gap-2" aria-describedby={fieldState.error ? `${listId}-error` : undefined}>
              <legend className="flex w-full flex-wrap items-baseline justify-between gap-2 text-body font-medium text-ink">
                <span>
                  Results to average <span className="text-caption font-normal text-ink-subtle">required · {set.size} ticked</span>
                </span>
              </legend>
              <div className="flex flex-wrap gap-2">
                <Button variant="ghost" size="sm" onClick={() => field.onChange(candidates.slice(0, QUICK_PICK).map((s) => s.id))} disabled={candidates.length === 0}>
                  Tick the latest {Math.min(QUICK_PICK, candidates.length) || QUICK_PICK}
                </Button>
                <Button variant="ghost" size="sm" onClick={() => field.onChange([])} disabled={set.size === 0}>
                  Clear
                </Button>
              </div>
              {scans.isPending ? (
                <SkeletonText lines={4} />
              ) : scans.error ? (
                <Callout tone="error" title="The results could not be loaded">{errorMessage(scans.error)}</Callout>
              ) : candidates.length === 0 ? (
                <p className="text-body text-ink-muted">This test has no results yet. Upload some first.</p>
              ) : (
                <ul id={listId} className="max-h-72 divide-y divide-line overflow-y-auto rounded-control border border-line" data-testid="baseline-candidates">
                  {candidates.map((s) => (
                    <li key={s.id}>
                      <label className="flex cursor-pointer items-center gap-3 px-3 py-2 hover:bg-surface-hover">
                        <input type="checkbox" className="size-4 accent-accent" checked={set.has(s.id)} onChange={(e) => toggle(s.id, e.target.checked)} />
                        <span className="w-28 shrink-0 font-medium">{formatDate(s.acquiredAt)}</span>
                        <span className="flex-1 tnum text-ink-muted">
                          {[s.mtf50 !== null ? `MTF50 ${formatValueWithUnit("mtf50", s.mtf50)}` : null, s.fwhmMm !== null ? `FWHM ${formatValueWithUnit("fwhmMm", s.fwhmMm)}` : null]
                            .filter(Boolean)
                            .join(" · ") || "no values"}
                        </span>
                        <StatusBadge status={s.status} size="sm" />
                      </label>
                    </li>
                  ))}
                </ul>
              )}
              {fieldState.error ? (
                <p id={`${listId}-error`} className="text-caption font-medium text-act">{fieldState.error.message}</p>
              ) : null}
            </fieldset>
          );
        }}
      />

      <Field label="Reason" required hint="Recorded with the baseline, e.g. “acceptance test”, “after tube replacement on 3 Mar”." error={formState.errors.reason?.message}>
        <Textarea rows={2} {...register("reason")} />
      </Field>
      <ServerError error={error} title="The baseline was not set" />
    </form>
  );
}
