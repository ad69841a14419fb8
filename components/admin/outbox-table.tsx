"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper } from "@tanstack/react-table";
import { useId, useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button, Callout, Card, DataTable, Dialog, Field, Input, StatusBadge } from "@/components/ui";
import { formatDateTime } from "@/lib/format/dates";
import type { MailMessage } from "@/db/schema";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { testMailSchema } from "@/lib/validations/alert";

/** A row of GET /api/admin/outbox (dates as ISO strings). */
export type OutboxMessage = { [K in keyof MailMessage]: MailMessage[K] extends Date ? string : MailMessage[K] extends Date | null ? string | null : MailMessage[K] };

const OUTBOX_KEY = ["admin", "outbox"] as const;

/** Delivery state as a chip: shape and words, not colour alone. "Retrying" is a pending message whose last attempt failed. */
function DeliveryState({ message }: { message: OutboxMessage }) {
  if (message.state === "sent") return <StatusBadge status="pass" label="Sent" title={`Sent ${formatDateTime(message.sentAt)}`} />;
  if (message.state === "failed") return <StatusBadge status="action" label="Failed" title={`Gave up after ${message.attempts} attempts`} />;
  if (message.attempts > 0) return <StatusBadge status="warning" label="Retrying" title={`Attempt ${message.attempts} failed; next ${formatDateTime(message.nextAttemptAt)}`} />;
  return <StatusBadge status="due" label="Pending" title="Waiting for the sender (every few seconds)" />;
}

/** Attempts so far and what comes next: "1 attempt · next 12 Mar, 14:05", "2 attempts · sent …", "12 attempts · gave up". */
function DeliveryProgress({ message }: { message: OutboxMessage }) {
  const attempts = `${message.attempts} ${message.attempts === 1 ? "attempt" : "attempts"}`;
  if (message.state === "sent") return <>{attempts} · sent {formatDateTime(message.sentAt)}</>;
  if (message.state === "failed") return <>{attempts} · gave up</>;
  return (
    <>
      {attempts} · next {formatDateTime(message.nextAttemptAt)}
    </>
  );
}

const col = createColumnHelper<OutboxMessage>();

/** Queued, sent and failed e-mails (newest first), refreshed every few seconds; a row (or its subject) opens the message, "Retry now" sends it again. */
export function OutboxTable() {
  const queryClient = useQueryClient();
  const [preview, setPreview] = useState<OutboxMessage | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const outbox = useQuery({
    queryKey: OUTBOX_KEY,
    queryFn: ({ signal }) => fetchJson<{ messages: OutboxMessage[] }>("/api/admin/outbox", { signal }).then((r) => r.messages),
    refetchInterval: 5_000,
  });
  const retry = useMutation({
    mutationFn: (m: OutboxMessage) => fetchJson(`/api/admin/outbox/${m.id}/retry`, { method: "POST" }),
    onMutate: () => setNotice(null),
    onSuccess: async (_data, m) => {
      setNotice(`The message to ${m.toAddress} is back at the front of the queue: the sender tries it within seconds.`);
      await queryClient.invalidateQueries({ queryKey: OUTBOX_KEY });
    },
  });
  const retryMutate = retry.mutate;
  const retryingId = retry.isPending ? retry.variables?.id : undefined;

  const columns = useMemo(
    () => [
      col.accessor("createdAt", { header: "Created", cell: (c) => <span className="tnum">{formatDateTime(c.getValue())}</span> }),
      col.accessor("toAddress", {
        header: "To",
        meta: { cellClassName: "max-w-48" },
        cell: (c) => (
          <span className="block truncate" title={c.getValue()}>
            {c.getValue()}
          </span>
        ),
      }),
      col.accessor((m) => `${m.subject} ${m.kind}`, {
        id: "subject",
        header: "Subject and kind",
        meta: { wrap: true, cellClassName: "min-w-72 max-w-sm" },
        cell: ({ row }) => (
          <>
            <button
              type="button"
              aria-haspopup="dialog"
              onClick={() => setPreview(row.original)}
              className="text-left font-medium text-ink underline-offset-2 hover:text-accent hover:underline"
            >
              {row.original.subject}
            </button>
            <span className="block text-caption text-ink-subtle">{row.original.kind}</span>
          </>
        ),
      }),
      col.accessor("state", {
        header: "State",
        cell: ({ row }) => (
          <>
            <DeliveryState message={row.original} />
            <span className="block text-caption whitespace-nowrap text-ink-subtle tnum">
              <DeliveryProgress message={row.original} />
            </span>
          </>
        ),
      }),
      col.accessor((m) => m.lastError ?? "", {
        id: "lastError",
        header: "Last error",
        enableSorting: false,
        meta: { wrap: true, cellClassName: "min-w-36 max-w-60" },
        cell: (c) =>
          c.getValue() ? (
            <span className="line-clamp-2 break-words text-act" title={c.getValue()}>
              {c.getValue()}
            </span>
          ) : (
            <span className="text-ink-subtle">—</span>
          ),
      }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        // The cell is the containing block of the sr-only header text, so it stays inside the table's scroller.
        meta: { headerClassName: "relative", cellClassName: "text-right" },
        cell: ({ row }) => {
          const m = row.original;
          // A fresh pending message is already due: "Retry now" is for failed ones and those waiting after a failure.
          return m.state === "failed" || (m.state === "pending" && m.attempts > 0) ? (
            <Button
              variant="secondary"
              size="sm"
              loading={retryingId === m.id}
              loadingText="Queuing…"
              onClick={() => retryMutate(m)}
              aria-label={`Retry now: message to ${m.toAddress}, ${m.subject}`}
            >
              Retry now
            </Button>
          ) : null;
        },
      }),
    ],
    [retryMutate, retryingId],
  );

  return (
    <div className="flex flex-col gap-3">
      <div aria-live="polite">
        {notice ? (
          <Callout tone="success" role="status">
            {notice}
          </Callout>
        ) : null}
      </div>
      {retry.error ? (
        <Callout tone="error" title="The message was not queued again">
          {errorMessage(retry.error)}
        </Callout>
      ) : null}
      {outbox.isError ? (
        <Callout
          tone="error"
          title="The outbox could not be loaded"
          actions={
            <Button variant="secondary" size="sm" onClick={() => outbox.refetch()}>
              Try again
            </Button>
          }
        >
          {errorMessage(outbox.error)}
        </Callout>
      ) : (
        <Card>
          <DataTable
            data={outbox.data ?? []}
            columns={columns}
            caption="Outbox"
            loading={outbox.isPending}
            getRowId={(m) => String(m.id)}
            filterPlaceholder="Address, subject, kind…"
            onRowClick={setPreview}
            initialPageSize={25}
            emptyTitle="No e-mail yet"
            emptyDescription="Alert e-mails, daily digests and test messages appear here as soon as they are queued."
          />
        </Card>
      )}
      {preview ? <MessagePreview message={preview} onClose={() => setPreview(null)} /> : null}
    </div>
  );
}

/** The text body of one message as the recipient reads it, with its delivery record. */
function MessagePreview({ message, onClose }: { message: OutboxMessage; onClose: () => void }) {
  return (
    <Dialog
      open
      size="lg"
      closeOnBackdrop
      onOpenChange={(open) => {
        if (!open) onClose();
      }}
      title={message.subject}
      description={`To ${message.toAddress} · ${message.kind} · queued ${formatDateTime(message.createdAt)}`}
      footer={
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      <div className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2 text-body text-ink-muted">
          <DeliveryState message={message} />
          <span className="tnum">
            {message.attempts} {message.attempts === 1 ? "attempt" : "attempts"}
          </span>
          {message.state === "sent" ? <span>Sent {formatDateTime(message.sentAt)}</span> : null}
          {message.state === "pending" ? <span>Next attempt {formatDateTime(message.nextAttemptAt)}</span> : null}
        </div>
        {message.lastError ? (
          <Callout tone="error" role="note" title="Last error">
            <span className="break-all">{message.lastError}</span>
          </Callout>
        ) : null}
        <pre className="max-h-[28rem] overflow-auto rounded-control border border-line bg-surface-canvas p-3 font-mono text-caption whitespace-pre-wrap text-ink" data-testid="outbox-preview-text">
          {message.textBody}
        </pre>
        {message.dedupeKey ? <p className="text-caption text-ink-subtle">Deduplication key: {message.dedupeKey}</p> : null}
      </div>
    </Dialog>
  );
}

type TestMailValues = z.input<typeof testMailSchema>;
type TestMailInput = z.output<typeof testMailSchema>;

/** POST /api/admin/mail/test: queue a test message through the same outbox as every alert e-mail. */
export function TestMailForm({ defaultTo }: { defaultTo: string }) {
  const formId = useId();
  const queryClient = useQueryClient();
  const { register, handleSubmit, formState } = useForm<TestMailValues, unknown, TestMailInput>({
    resolver: zodResolver(testMailSchema),
    defaultValues: { to: defaultTo },
  });
  const send = useMutation({
    mutationFn: (input: TestMailInput) => fetchJson<{ queued: boolean; to: string; message: string }>("/api/admin/mail/test", { method: "POST", body: input }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: OUTBOX_KEY });
    },
  });
  // A new attempt clears the outcome of the previous one, valid or not.
  const onSubmit = handleSubmit(
    (values) => {
      send.reset();
      return send.mutateAsync(values).catch(() => undefined);
    },
    () => send.reset(),
  );
  const pending = formState.isSubmitting || send.isPending;

  return (
    <form id={formId} onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-2">
        <Field label="To" required className="min-w-64 flex-1" error={formState.errors.to?.message}>
          <Input type="email" autoComplete="email" {...register("to")} />
        </Field>
        <Button type="submit" variant="secondary" loading={pending} loadingText="Queuing…" className={formState.errors.to ? "mb-6" : undefined}>
          Send test message
        </Button>
      </div>
      <div aria-live="polite">
        {send.isSuccess ? (
          <Callout tone="success" role="status">
            Queued for {send.data.to}. Its row in the table below shows when it is sent, or why not.
          </Callout>
        ) : null}
      </div>
      {send.error ? (
        <Callout tone="error" title="The test message was not queued">
          {errorMessage(send.error)}
        </Callout>
      ) : null}
    </form>
  );
}
