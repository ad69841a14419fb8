"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import { useId, useMemo } from "react";
import { Controller, useForm } from "react-hook-form";
import type { z } from "zod";
import { FormDialog } from "@/components/ui/form-dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { Spinner } from "@/components/ui/spinner";
import { fetchJson } from "@/lib/api/fetch-json";
import { createScannerSchema, type CreateScannerInput } from "@/lib/validations/scanner";
import { QUERY_KEYS, type ScannerRow, type SiteRow, type UserRow } from "./admin-types";
import { MODALITY_OPTIONS } from "@/lib/modalities";
import { ServerError } from "./server-error";
import { useRegisterSave } from "./use-register-save";

type ScannerFormValues = z.input<typeof createScannerSchema>;

interface Person {
  id: number;
  name: string;
  active: boolean;
}

export interface ScannerFormDialogProps {
  open: boolean;
  /** The scanner to edit, or null to add one. */
  scanner: ScannerRow | null;
  onClose: () => void;
  onSaved: () => void;
}

/**
 * "Add scanner" / "Edit …" dialog with one form (createScannerSchema): POST /api/scanners or PATCH /api/scanners/{id}
 * with every field, so nothing is left to server-side defaults. Stays mounted; the form mounts fresh on open.
 */
export function ScannerFormDialog({ open, scanner, onClose, onSaved }: ScannerFormDialogProps) {
  const formId = useId();
  const sites = useQuery({
    queryKey: QUERY_KEYS.sites,
    queryFn: ({ signal }) => fetchJson<{ sites: SiteRow[] }>("/api/sites", { signal }).then((r) => r.sites),
    enabled: open,
  });
  const users = useQuery({
    queryKey: QUERY_KEYS.users,
    queryFn: ({ signal }) => fetchJson<{ users: UserRow[] }>("/api/users", { signal }).then((r) => r.users),
    enabled: open,
  });
  const { save, close } = useRegisterSave<CreateScannerInput>({
    collectionUrl: "/api/scanners",
    id: scanner ? scanner.id : null,
    invalidate: [["scanners"], QUERY_KEYS.sites], // sites show scanner counts
    onSaved,
    onClose,
  });
  const ready = sites.isSuccess && users.isSuccess;

  let content;
  if (ready) {
    // Mounted once the options exist, so the selects show their initial values.
    content = <ScannerForm formId={formId} scanner={scanner} sites={sites.data} users={users.data} onSubmit={(input) => save.mutateAsync(input).catch(() => undefined)} />;
  } else if (sites.isError || users.isError) {
    content = <ServerError error={sites.error ?? users.error} title="The sites and people to choose from could not be loaded" />;
  } else {
    content = (
      <p className="flex items-center gap-2 text-body text-ink-muted">
        <Spinner size="sm" decorative /> Loading sites and people…
      </p>
    );
  }

  return (
    <FormDialog
      open={open}
      size="lg"
      onClose={close}
      title={scanner ? `Edit ${scanner.name}` : "Add scanner"}
      description="Identification, responsibility and alerting of one scanner in the register."
      formId={formId}
      pending={save.isPending}
      submitLabel="Save scanner"
      pendingLabel="Saving…"
      submitDisabled={!ready}
    >
      <div className="flex flex-col gap-4">
        {/* Above the long form, so it is seen without scrolling. */}
        <ServerError error={save.error} title="The scanner was not saved" />
        {content}
      </div>
    </FormDialog>
  );
}

function defaultsFor(scanner: ScannerRow | null): ScannerFormValues {
  return {
    name: scanner?.name ?? "",
    siteId: scanner ? String(scanner.siteId) : "",
    // Empty until chosen; the schema answers "Modality must be one of …" if it stays empty.
    modality: scanner?.modality ?? ("" as ScannerFormValues["modality"]),
    manufacturer: scanner?.manufacturer ?? "",
    model: scanner?.model ?? "",
    serialNumber: scanner?.serialNumber ?? "",
    location: scanner?.location ?? "",
    responsiblePhysicistId: scanner?.responsiblePhysicistId ?? null,
    engineerIds: scanner?.engineers.map((e) => e.id) ?? [],
    alertOnWarning: scanner?.alertOnWarning ?? false,
  };
}

/** Active people of a role, plus those assigned now even if since deactivated (so an edit shows the truth). */
function peopleFor(users: UserRow[], role: "physicist" | "engineer", keepIds: number[]): Person[] {
  return users
    .filter((u) => u.role === role && (u.active || keepIds.includes(u.id)))
    .map((u) => ({ id: u.id, name: u.name, active: u.active }))
    .sort((a, b) => a.name.localeCompare(b.name));
}

interface ScannerFormProps {
  formId: string;
  scanner: ScannerRow | null;
  sites: SiteRow[];
  users: UserRow[];
  onSubmit: (input: CreateScannerInput) => Promise<unknown>;
}

function ScannerForm({ formId, scanner, sites, users, onSubmit }: ScannerFormProps) {
  const physicists = useMemo(() => peopleFor(users, "physicist", scanner?.responsiblePhysicistId ? [scanner.responsiblePhysicistId] : []), [users, scanner]);
  const engineers = useMemo(() => peopleFor(users, "engineer", scanner?.engineers.map((e) => e.id) ?? []), [users, scanner]);
  const { register, handleSubmit, control, formState } = useForm<ScannerFormValues, unknown, CreateScannerInput>({
    resolver: zodResolver(createScannerSchema),
    defaultValues: defaultsFor(scanner),
  });
  const errors = formState.errors;

  return (
    <form id={formId} onSubmit={handleSubmit(onSubmit)} noValidate className="flex flex-col gap-5">
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Name" required hint="As the department calls it, e.g. “CT 2 (Emergency)”." error={errors.name?.message} className="sm:col-span-2">
          <Input autoComplete="off" autoFocus {...register("name")} />
        </Field>
        <Field label="Site" required error={errors.siteId?.message}>
          <Select placeholder="Choose a site…" {...register("siteId")}>
            {sites.map((s) => (
              <option key={s.id} value={String(s.id)}>
                {s.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Modality" required error={errors.modality?.message}>
          <Select placeholder="Choose a modality…" {...register("modality")}>
            {MODALITY_OPTIONS.map((m) => (
              <option key={m.value} value={m.value}>
                {m.label}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Manufacturer" error={errors.manufacturer?.message}>
          <Input autoComplete="off" {...register("manufacturer")} />
        </Field>
        <Field label="Model" error={errors.model?.message}>
          <Input autoComplete="off" {...register("model")} />
        </Field>
        <Field label="Serial number" error={errors.serialNumber?.message}>
          <Input autoComplete="off" spellCheck={false} {...register("serialNumber")} />
        </Field>
        <Field label="Location" hint="Department and room." error={errors.location?.message}>
          <Input autoComplete="off" {...register("location")} />
        </Field>
        <Field
          label="Responsible physicist"
          hint="The medical physicist accountable for this scanner's QA."
          error={errors.responsiblePhysicistId?.message}
          className="sm:col-span-2"
        >
          <Select placeholder="None" {...register("responsiblePhysicistId", { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v)) })}>
            {physicists.map((p) => (
              <option key={p.id} value={String(p.id)}>
                {p.active ? p.name : `${p.name} (deactivated)`}
              </option>
            ))}
          </Select>
        </Field>
      </div>

      <Controller
        control={control}
        name="engineerIds"
        render={({ field, fieldState }) => {
          const selected = new Set(((field.value ?? []) as unknown[]).map(Number));
          const toggle = (id: number, on: boolean) => {
            const next = new Set(selected);
            if (on) next.add(id);
            else next.delete(id);
            field.onChange([...next]);
          };
          return (
            <fieldset className="flex flex-col gap-1.5" aria-describedby={`${formId}-engineers-hint`}>
              <legend className="text-body font-medium text-ink">Assigned engineers</legend>
              <p id={`${formId}-engineers-hint`} className="text-caption text-ink-subtle">
                Service engineers see only the scanners assigned to them.
              </p>
              {engineers.length === 0 ? (
                <p className="text-caption text-ink-muted">No active service engineers yet (add them under Users).</p>
              ) : (
                <ul className="mt-1 grid gap-x-4 gap-y-1.5 sm:grid-cols-2">
                  {engineers.map((e) => (
                    <li key={e.id}>
                      <label className="flex items-center gap-2 text-body">
                        <input
                          type="checkbox"
                          className="size-4 accent-accent"
                          checked={selected.has(e.id)}
                          onChange={(event) => toggle(e.id, event.target.checked)}
                          onBlur={field.onBlur}
                        />
                        {e.active ? e.name : `${e.name} (deactivated)`}
                      </label>
                    </li>
                  ))}
                </ul>
              )}
              {fieldState.error?.message ? <p className="text-caption font-medium text-act">{fieldState.error.message}</p> : null}
            </fieldset>
          );
        }}
      />

      <div className="flex flex-col gap-1">
        <label className="flex items-center gap-2 text-body font-medium text-ink">
          <input type="checkbox" className="size-4 accent-accent" aria-describedby={`${formId}-warning-hint`} {...register("alertOnWarning")} />
          Alert on warning results
        </label>
        <p id={`${formId}-warning-hint`} className="pl-6 text-caption text-ink-subtle">
          Open an alert for warning-level results too (action-level results always open one).
        </p>
      </div>
    </form>
  );
}
