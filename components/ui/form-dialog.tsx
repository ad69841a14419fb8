"use client";

import type { ReactNode } from "react";
import { Button } from "./button";
import { Dialog, type DialogProps } from "./dialog";

export interface FormDialogProps extends Pick<DialogProps, "open" | "title" | "description" | "size" | "children"> {
  /** Called on Cancel, Escape or the × button — never while `pending`, so a running save cannot be walked away from. */
  onClose: () => void;
  /** `id` of the `<form>` inside; the submit button submits it from the footer. */
  formId: string;
  /** True while the save runs: Cancel is disabled, the submit button shows `pendingLabel`. */
  pending: boolean;
  submitLabel: ReactNode;
  /** Submit button text while pending, e.g. "Saving…". */
  pendingLabel: string;
  /** Disable the submit button (e.g. until the form's options have loaded). */
  submitDisabled?: boolean;
}

/**
 * A Dialog holding one form, with the Cancel + submit footer every editing dialog shares. The form goes in
 * `children` with `id={formId}`.
 */
export function FormDialog({ open, onClose, title, description, size, formId, pending, submitLabel, pendingLabel, submitDisabled, children }: FormDialogProps) {
  const close = () => {
    if (!pending) onClose();
  };
  return (
    <Dialog
      open={open}
      size={size}
      onOpenChange={(next) => {
        if (!next) close();
      }}
      title={title}
      description={description}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={pending}>
            Cancel
          </Button>
          <Button type="submit" form={formId} loading={pending} loadingText={pendingLabel} disabled={submitDisabled}>
            {submitLabel}
          </Button>
        </>
      }
    >
      {children}
    </Dialog>
  );
}
