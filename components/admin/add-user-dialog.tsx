"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useId } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FormDialog } from "@/components/ui/form-dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { ROLES } from "@/db/schema";
import { fetchJson } from "@/lib/api/fetch-json";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { createUserSchema, type CreateUserInput } from "@/lib/validations/user";
import { QUERY_KEYS } from "./admin-types";
import { ServerError } from "./server-error";

type AddUserFormValues = z.input<typeof createUserSchema>;

/**
 * "Add user" dialog: e-mail, name, role and an optional initial password (empty → invitation e-mail).
 * Stays mounted; the form inside mounts fresh each time the dialog opens.
 */
export function AddUserDialog({ open, onClose, onAdded }: { open: boolean; onClose: () => void; onAdded: (result: { invited: boolean }) => void }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const create = useMutation({
    mutationFn: (input: CreateUserInput) => fetchJson<{ id: number; invited: boolean }>("/api/users", { method: "POST", body: input }),
    onSuccess: async (result) => {
      await queryClient.invalidateQueries({ queryKey: QUERY_KEYS.users });
      create.reset();
      onAdded({ invited: result.invited });
    },
  });
  const close = () => {
    if (create.isPending) return;
    create.reset();
    onClose();
  };

  return (
    <FormDialog
      open={open}
      onClose={close}
      title="Add user"
      description="The new user signs in with their e-mail address and gets the permissions of their role."
      formId={formId}
      pending={create.isPending}
      submitLabel="Add user"
      pendingLabel="Adding…"
    >
      <div className="flex flex-col gap-4">
        <AddUserForm formId={formId} onSubmit={(input) => create.mutateAsync(input).catch(() => undefined)} />
        <ServerError error={create.error} title="The user was not added" />
      </div>
    </FormDialog>
  );
}

function AddUserForm({ formId, onSubmit }: { formId: string; onSubmit: (input: CreateUserInput) => Promise<unknown> }) {
  const { register, handleSubmit, formState } = useForm<AddUserFormValues, unknown, CreateUserInput>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: "", name: "", password: "" },
  });
  const errors = formState.errors;
  return (
    <form id={formId} onSubmit={handleSubmit(onSubmit)} noValidate className="flex flex-col gap-4">
      <Field label="E-mail" required error={errors.email?.message}>
        <Input type="email" autoComplete="off" autoFocus {...register("email")} />
      </Field>
      <Field label="Name" required error={errors.name?.message}>
        <Input autoComplete="off" {...register("name")} />
      </Field>
      <Field label="Role" required error={errors.role?.message}>
        <Select placeholder="Choose a role…" defaultValue="" {...register("role")}>
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </Select>
      </Field>
      <Field
        label="Initial password"
        hint="Optional. Leave it empty to send an invitation e-mail with a link (valid for 72 hours) where the person chooses their own password."
        error={errors.password?.message}
      >
        <Input type="password" autoComplete="new-password" {...register("password")} />
      </Field>
    </form>
  );
}
