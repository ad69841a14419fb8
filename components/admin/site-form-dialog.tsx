"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useId } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FormDialog } from "@/components/ui/form-dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { createSiteSchema, type CreateSiteInput } from "@/lib/validations/site";
import { QUERY_KEYS, type SiteRow } from "./admin-types";
import { ServerError } from "./server-error";
import { useRegisterSave } from "./use-register-save";

type SiteFormValues = z.input<typeof createSiteSchema>;

export interface SiteFormDialogProps {
  open: boolean;
  /** The site to rename, or null to add one. */
  site: SiteRow | null;
  onClose: () => void;
  onSaved: () => void;
}

/**
 * Add a site (POST /api/sites) or rename one (PATCH /api/sites/{id}). Stays mounted; the form mounts fresh on open.
 * A rename sends name and city together, so neither is reset by the other's absence.
 */
export function SiteFormDialog({ open, site, onClose, onSaved }: SiteFormDialogProps) {
  const formId = useId();
  const { save, close } = useRegisterSave<CreateSiteInput>({
    collectionUrl: "/api/sites",
    id: site ? site.id : null,
    invalidate: [QUERY_KEYS.sites, ["scanners"]], // scanner lists show site names
    onSaved,
    onClose,
  });

  return (
    <FormDialog
      open={open}
      size="sm"
      onClose={close}
      title={site ? `Edit ${site.name}` : "Add site"}
      description={site ? "Scanners at this site keep their history; only what is displayed changes." : "A hospital, clinic or building where scanners stand."}
      formId={formId}
      pending={save.isPending}
      submitLabel="Save site"
      pendingLabel="Saving…"
    >
      <div className="flex flex-col gap-4">
        <SiteForm
          formId={formId}
          site={site}
          onSubmit={(input) => {
            if (site && input.name === site.name && input.city === site.city) {
              close();
              return Promise.resolve();
            }
            return save.mutateAsync(input).catch(() => undefined);
          }}
        />
        <ServerError error={save.error} title={site ? "The site was not renamed" : "The site was not added"} />
      </div>
    </FormDialog>
  );
}

function SiteForm({ formId, site, onSubmit }: { formId: string; site: SiteRow | null; onSubmit: (input: CreateSiteInput) => Promise<unknown> }) {
  const { register, handleSubmit, formState } = useForm<SiteFormValues, unknown, CreateSiteInput>({
    resolver: zodResolver(createSiteSchema),
    defaultValues: { name: site?.name ?? "", city: site?.city ?? "" },
  });
  return (
    <form id={formId} onSubmit={handleSubmit(onSubmit)} noValidate className="flex flex-col gap-4">
      <Field label="Name" required error={formState.errors.name?.message}>
        <Input autoComplete="off" autoFocus {...register("name")} />
      </Field>
      <Field label="City" error={formState.errors.city?.message}>
        <Input autoComplete="off" {...register("city")} />
      </Field>
    </form>
  );
}
