"use client";

import type { ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { ServerError } from "./server-error";

export interface ConfirmDialogProps {
  /** Keep the component mounted and toggle this (the Dialog must see open change from false to true). */
  open: boolean;
  title: ReactNode;
  /** What will happen, in a sentence or two. */
  children: ReactNode;
  confirmLabel: string;
  pendingLabel: string;
  /** `danger` for removing or deactivating. */
  variant?: "primary" | "danger";
  pending: boolean;
  /** Error of the last attempt (shown in the dialog, which stays open). */
  error: unknown;
  onConfirm: () => void;
  onCancel: () => void;
}

/** An alertdialog asking to confirm one action. */
export function ConfirmDialog({ open, title, children, confirmLabel, pendingLabel, variant = "danger", pending, error, onConfirm, onCancel }: ConfirmDialogProps) {
  return (
    <Dialog
      open={open}
      role="alertdialog"
      size="sm"
      onOpenChange={(next) => {
        if (!next && !pending) onCancel();
      }}
      title={title}
      footer={
        <>
          <Button variant="secondary" onClick={onCancel} disabled={pending}>
            Cancel
          </Button>
          <Button variant={variant} onClick={onConfirm} loading={pending} loadingText={pendingLabel}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-3 text-body text-ink-muted">
        {children}
        <ServerError error={error} title="That did not work" />
      </div>
    </Dialog>
  );
}
