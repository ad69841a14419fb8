"use client";

import { useMutation } from "@tanstack/react-query";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { MAIL_PREFERENCES } from "@/db/schema";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";

type MailPreference = (typeof MAIL_PREFERENCES)[number];

const OPTIONS: Record<MailPreference, { label: string; hint: string }> = {
  immediate: { label: "Immediately", hint: "An e-mail as soon as an alert concerns you." },
  digest: { label: "Daily digest", hint: "One summary e-mail a day with the alerts of the last 24 hours." },
  off: { label: "Off", hint: "No alert e-mails; alerts stay visible in Halfmax. Invitations and password resets still arrive." },
};

/** Radio group for the caller's alert e-mail preference, saved with PATCH /api/me/preferences. */
export function MailPreferenceForm({ initial }: { initial: MailPreference }) {
  const name = useId();
  const [saved, setSaved] = useState<MailPreference>(initial);
  const [choice, setChoice] = useState<MailPreference>(initial);
  const save = useMutation({
    mutationFn: (mailPreference: MailPreference) =>
      fetchJson<{ mailPreference: MailPreference }>("/api/me/preferences", { method: "PATCH", body: { mailPreference } }),
    onSuccess: (result) => {
      setSaved(result.mailPreference);
      setChoice(result.mailPreference);
    },
  });

  return (
    <form
      className="flex flex-col gap-4"
      onSubmit={(event) => {
        event.preventDefault();
        save.mutate(choice);
      }}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-body font-medium text-ink">Send me alert e-mails</legend>
        {MAIL_PREFERENCES.map((value) => (
          <label key={value} className="flex items-start gap-2.5 rounded-control px-1 py-1 text-body">
            <input
              type="radio"
              name={name}
              value={value}
              checked={choice === value}
              onChange={() => {
                save.reset();
                setChoice(value);
              }}
              aria-describedby={`${name}-${value}-hint`}
              className="mt-1 size-4 accent-accent"
            />
            <span className="flex flex-col">
              <span className="font-medium text-ink">{OPTIONS[value].label}</span>
              <span id={`${name}-${value}-hint`} className="text-caption text-ink-muted">
                {OPTIONS[value].hint}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" loading={save.isPending} loadingText="Saving…" disabled={choice === saved && !save.isPending}>
          Save mail preference
        </Button>
        <span aria-live="polite" className="text-caption text-ink-muted">
          {save.isSuccess ? `Saved: ${OPTIONS[saved].label.toLowerCase()}.` : choice !== saved ? "Not saved yet." : ""}
        </span>
      </div>
      {save.isError ? (
        <Callout tone="error" title="The preference was not saved">
          {errorMessage(save.error)}
        </Callout>
      ) : null}
    </form>
  );
}
