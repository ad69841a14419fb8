"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button, Callout, Field, Textarea } from "@/components/ui";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";

export interface SignOffPanelProps {
  scanId: number;
  /** Present once signed: who, when (already formatted) and the note. */
  signOff: { by: string | null; at: string; note: string | null } | null;
  /** The signed-in user may sign off (physicists); the server checks it again. */
  canSignOff: boolean;
}

/** Sign-off state of a result; physicists sign off with an optional note (POST /api/scans/{id}/sign-off). */
export function SignOffPanel({ scanId, signOff, canSignOff }: SignOffPanelProps) {
  const router = useRouter();
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const [refreshing, startRefresh] = useTransition();

  if (signOff) {
    return (
      <div className="flex flex-col gap-2" data-testid="sign-off" data-signed="true">
        <Callout tone="success" title={`Signed off by ${signOff.by ?? "a physicist"}`}>
          <p>{signOff.at}</p>
          {signOff.note ? <p className="mt-1 whitespace-pre-wrap text-ink">&ldquo;{signOff.note}&rdquo;</p> : null}
        </Callout>
      </div>
    );
  }

  if (!canSignOff) {
    return (
      <p className="text-body text-ink-muted" data-testid="sign-off" data-signed="false">
        Not signed off yet. A medical physicist reviews and signs off each result.
      </p>
    );
  }

  const submit = async () => {
    setSaving(true);
    setError(null);
    try {
      await fetchJson(`/api/scans/${scanId}/sign-off`, { method: "POST", body: note.trim() ? { note: note.trim() } : {} });
      startRefresh(() => router.refresh());
    } catch (err) {
      setError(errorMessage(err));
    } finally {
      setSaving(false);
    }
  };

  return (
    <form
      className="flex max-w-2xl flex-col gap-3"
      data-testid="sign-off"
      data-signed="false"
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      <p className="text-body text-ink-muted">
        Not signed off yet. Signing records your name and the time against this result; it cannot be undone.
      </p>
      <Field label="Sign-off note" hint="Optional: your conclusion, or the action taken.">
        <Textarea rows={3} maxLength={2000} value={note} onChange={(event) => setNote(event.target.value)} />
      </Field>
      {error ? <Callout tone="error">{error}</Callout> : null}
      <div>
        <Button type="submit" loading={saving || refreshing} loadingText="Signing off…">
          Sign off this result
        </Button>
      </div>
    </form>
  );
}
