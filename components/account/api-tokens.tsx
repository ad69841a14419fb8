"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { ConfirmDialog } from "@/components/admin/confirm-dialog";
import { formatDateTime } from "@/lib/format/dates";
import { ServerError } from "@/components/admin/server-error";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Dialog } from "@/components/ui/dialog";
import { FormDialog } from "@/components/ui/form-dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Skeleton } from "@/components/ui/skeleton";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table-shell";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { createTokenSchema, type CreateTokenInput } from "@/lib/validations/user";

interface TokenRow {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

interface CreatedToken {
  id: number;
  token: string;
  prefix: string;
  name: string;
}

const TOKENS_KEY = ["tokens"] as const;

/** The caller's personal API tokens: list, create (secret shown once), revoke. */
export function ApiTokens() {
  const queryClient = useQueryClient();
  const tokens = useQuery({
    queryKey: TOKENS_KEY,
    queryFn: ({ signal }) => fetchJson<{ tokens: TokenRow[] }>("/api/tokens", { signal }).then((r) => r.tokens),
  });
  const [creating, setCreating] = useState(false);
  const [created, setCreated] = useState<CreatedToken | null>(null);
  const [revoking, setRevoking] = useState<TokenRow | null>(null);

  const revoke = useMutation({
    mutationFn: (token: TokenRow) => fetchJson(`/api/tokens/${token.id}`, { method: "DELETE" }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: TOKENS_KEY });
      setRevoking(null);
    },
  });

  let body;
  if (tokens.isPending) {
    body = (
      <div aria-busy="true" className="flex flex-col gap-2 px-5 py-4">
        <Skeleton className="h-4 w-2/3" />
        <Skeleton className="h-4 w-1/2" />
      </div>
    );
  } else if (tokens.isError) {
    body = (
      <Callout
        tone="error"
        title="Your tokens could not be loaded"
        className="m-5"
        actions={
          <Button variant="secondary" size="sm" onClick={() => tokens.refetch()}>
            Try again
          </Button>
        }
      >
        {errorMessage(tokens.error)}
      </Callout>
    );
  } else if (tokens.data.length === 0) {
    body = <EmptyState size="compact" titleAs="p" title="No API tokens yet" description="Create one for each script or device that calls the Halfmax API." />;
  } else {
    body = (
      <Table caption="Your API tokens" captionHidden>
        <THead>
          <Tr>
            <Th>Name</Th>
            <Th>Token</Th>
            <Th>Created</Th>
            <Th>Last used</Th>
            <Th>Status</Th>
            <Th>
              <span className="sr-only">Actions</span>
            </Th>
          </Tr>
        </THead>
        <TBody>
          {tokens.data.map((t) => (
            <Tr key={t.id}>
              <Td className="font-medium">{t.name}</Td>
              <Td muted>
                <code className="tnum">{t.prefix}…</code>
              </Td>
              <Td muted className="whitespace-nowrap">
                {formatDateTime(t.createdAt)}
              </Td>
              <Td muted className="whitespace-nowrap">
                {formatDateTime(t.lastUsedAt, "Never")}
              </Td>
              <Td muted className="whitespace-nowrap">
                {t.revokedAt ? `Revoked ${formatDateTime(t.revokedAt)}` : "Active"}
              </Td>
              <Td className="text-right">
                {t.revokedAt ? null : (
                  <Button
                    variant="secondary"
                    size="sm"
                    onClick={() => {
                      revoke.reset();
                      setRevoking(t);
                    }}
                  >
                    Revoke<span className="sr-only"> {t.name}</span>
                  </Button>
                )}
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
    );
  }

  return (
    <div className="flex flex-col">
      <div className="flex flex-wrap items-start justify-between gap-3 px-5 py-4">
        <p className="max-w-prose text-body text-ink-muted">
          For scripts and exports that call the Halfmax API. A token acts as you, with your role&apos;s permissions; revoke it when the
          script is retired or the token may have leaked.
        </p>
        <Button onClick={() => setCreating(true)}>Create token</Button>
      </div>
      <div className="border-t border-line">{body}</div>

      <CreateTokenDialog
        open={creating}
        onClose={() => setCreating(false)}
        onCreated={(token) => {
          setCreating(false);
          setCreated(token);
        }}
      />

      <NewTokenDialog token={created} onClose={() => setCreated(null)} />

      <ConfirmDialog
        open={revoking !== null}
        title={`Revoke “${revoking?.name ?? ""}”?`}
        confirmLabel="Revoke token"
        pendingLabel="Revoking…"
        pending={revoke.isPending}
        error={revoke.error}
        onConfirm={() => {
          if (revoking) revoke.mutate(revoking);
        }}
        onCancel={() => setRevoking(null)}
      >
        <p>
          Requests with the token <code>{revoking?.prefix}…</code> are refused from now on. Scripts that use it need a new token. This
          cannot be undone.
        </p>
      </ConfirmDialog>
    </div>
  );
}

function CreateTokenDialog({ open, onClose, onCreated }: { open: boolean; onClose: () => void; onCreated: (token: CreatedToken) => void }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const create = useMutation({
    mutationFn: (input: CreateTokenInput) => fetchJson<{ id: number; token: string; prefix: string }>("/api/tokens", { method: "POST", body: input }),
    onSuccess: async (result, input) => {
      await queryClient.invalidateQueries({ queryKey: TOKENS_KEY });
      create.reset();
      onCreated({ ...result, name: input.name });
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
      size="sm"
      onClose={close}
      title="Create API token"
      formId={formId}
      pending={create.isPending}
      submitLabel="Create token"
      pendingLabel="Creating…"
    >
      <div className="flex flex-col gap-4">
        <CreateTokenForm formId={formId} onSubmit={(input) => create.mutateAsync(input).catch(() => undefined)} />
        <ServerError error={create.error} title="The token was not created" />
      </div>
    </FormDialog>
  );
}

function CreateTokenForm({ formId, onSubmit }: { formId: string; onSubmit: (input: CreateTokenInput) => Promise<unknown> }) {
  const { register, handleSubmit, formState } = useForm<CreateTokenInput>({ resolver: zodResolver(createTokenSchema), defaultValues: { name: "" } });
  return (
    <form id={formId} noValidate onSubmit={handleSubmit(onSubmit)} className="flex flex-col gap-4">
      <Field label="Token name" required hint="Name it after the script or device that will use it, e.g. “nightly PACS export”." error={formState.errors.name?.message}>
        <Input autoComplete="off" autoFocus {...register("name")} />
      </Field>
    </form>
  );
}

/** Shows a new token's secret once, with a copy button and a curl example. Open while `token` is set. */
function NewTokenDialog({ token, onClose }: { token: CreatedToken | null; onClose: () => void }) {
  return (
    <Dialog
      open={token !== null}
      onOpenChange={(next) => {
        if (!next) onClose();
      }}
      title={`New API token “${token?.name ?? ""}”`}
      footer={<Button onClick={onClose}>Done, I have copied it</Button>}
    >
      {token ? <NewTokenSecret token={token} /> : null}
    </Dialog>
  );
}

function NewTokenSecret({ token }: { token: CreatedToken }) {
  const inputId = useId();
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  // Rendered only in the browser, after a click, so window is available.
  const origin = typeof window === "undefined" ? "" : window.location.origin;
  const curl = `curl -H "Authorization: Bearer ${token.token}" ${origin}/api/scanners`;

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(token.token);
      setCopied("yes");
    } catch {
      // Clipboard API unavailable (e.g. plain http on another host): select the text for Ctrl+C instead.
      const input = document.getElementById(inputId);
      if (input instanceof HTMLInputElement) input.select();
      setCopied("failed");
    }
  };

  return (
    <div className="flex flex-col gap-4">
      <Callout tone="caution" title="Copy it now: it will not be shown again">
        Halfmax stores only a fingerprint of the token. If you lose it, revoke it and create a new one. Keep it out of e-mails, chat and
        version control.
      </Callout>
      <Field label="Secret">
        <Input id={inputId} readOnly value={token.token} spellCheck={false} className="font-mono" onFocus={(e) => e.currentTarget.select()} />
      </Field>
      <div className="flex items-center gap-3">
        <Button variant="secondary" onClick={copy}>
          Copy token
        </Button>
        <span aria-live="polite" className="text-caption text-ink-muted">
          {copied === "yes" ? "Copied to the clipboard." : copied === "failed" ? "Copying is blocked here: the token is selected, press Ctrl+C." : ""}
        </span>
      </div>
      <div className="flex flex-col gap-1.5">
        <p className="text-body font-medium text-ink">Try it</p>
        <pre className="whitespace-pre-wrap break-all rounded-control border border-line bg-surface-sunken px-3 py-2 text-caption">
          <code>{curl}</code>
        </pre>
        <p className="text-caption text-ink-subtle">Lists the scanners you may see, as JSON. Every API route accepts the same header.</p>
      </div>
    </div>
  );
}
