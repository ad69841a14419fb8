"use client";

import { useEffect, useId, useRef, type MouseEvent, type ReactNode } from "react";
import { cn } from "./cn";

const WIDTHS = { sm: "w-[min(100%-2rem,24rem)]", md: "w-[min(100%-2rem,34rem)]", lg: "w-[min(100%-2rem,48rem)]" } as const;

export interface DialogProps {
  /** Controlled open state. */
  open: boolean;
  /** Called with `false` on Escape, the close button, or (if enabled) a backdrop click. */
  onOpenChange: (open: boolean) => void;
  /** Visible title; the dialog is labelled by it. */
  title: ReactNode;
  /** Optional sentence under the title; the dialog is described by it. */
  description?: ReactNode;
  children?: ReactNode;
  /** Buttons row at the bottom (e.g. Cancel + Confirm); wire their clicks yourself. */
  footer?: ReactNode;
  size?: keyof typeof WIDTHS;
  /** Close when the dim backdrop is clicked. Default false, so a stray click never discards a half-filled form. */
  closeOnBackdrop?: boolean;
  /** Accessible name of the × button. Default "Close". */
  closeLabel?: string;
  /** `alertdialog` for confirmations that interrupt (e.g. "Re-baseline this scanner?"). */
  role?: "dialog" | "alertdialog";
  className?: string;
}

/**
 * Accessible modal on the native `<dialog>` element (`showModal()`): the browser traps focus and
 * makes the page inert. Escape closes it, focus returns to the element that had it before
 * opening (usually the trigger), and it is labelled by its title. Content mounts only while open.
 *
 * ```tsx
 * const [open, setOpen] = useState(false);
 * <Button onClick={() => setOpen(true)}>Acknowledge</Button>
 * <Dialog open={open} onOpenChange={setOpen} title="Acknowledge alert" footer={…}>…</Dialog>
 * ```
 */
export function Dialog({
  open,
  onOpenChange,
  title,
  description,
  children,
  footer,
  size = "md",
  closeOnBackdrop = false,
  closeLabel = "Close",
  role = "dialog",
  className,
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const pressStartedOnBackdrop = useRef(false);
  const onOpenChangeRef = useRef(onOpenChange);
  useEffect(() => {
    onOpenChangeRef.current = onOpenChange;
  });
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      dialog.showModal();
    } else if (!open && dialog.open) {
      dialog.close();
    }
  }, [open]);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    // Escape fires "cancel": keep the parent's state the single source of truth.
    const onCancel = (event: Event) => {
      event.preventDefault();
      onOpenChangeRef.current(false);
    };
    // Fires for every close (ours, a form method="dialog", or the browser's close watcher).
    const onClose = () => {
      const target = returnFocus.current;
      returnFocus.current = null;
      if (target && target.isConnected) target.focus();
      onOpenChangeRef.current(false);
    };
    dialog.addEventListener("cancel", onCancel);
    dialog.addEventListener("close", onClose);
    return () => {
      dialog.removeEventListener("cancel", onCancel);
      dialog.removeEventListener("close", onClose);
      if (dialog.open) {
        dialog.close();
        const target = returnFocus.current;
        if (target && target.isConnected) target.focus();
      }
    };
  }, []);

  // The dialog element itself is only hit on its backdrop: the panel below fills it.
  const onMouseDown = (event: MouseEvent<HTMLDialogElement>) => {
    pressStartedOnBackdrop.current = event.target === event.currentTarget;
  };
  const onClick = (event: MouseEvent<HTMLDialogElement>) => {
    if (closeOnBackdrop && pressStartedOnBackdrop.current && event.target === event.currentTarget) onOpenChange(false);
    pressStartedOnBackdrop.current = false;
  };

  return (
    <dialog
      ref={ref}
      role={role === "alertdialog" ? "alertdialog" : undefined}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onMouseDown={onMouseDown}
      onClick={onClick}
      className={cn(
        "m-auto max-h-[min(100dvh-3rem,56rem)] overflow-hidden rounded-card border border-line bg-surface p-0 text-ink shadow-overlay",
        "open:flex open:flex-col",
        WIDTHS[size],
        className,
      )}
    >
      {open ? (
        <>
          <header className="flex items-start justify-between gap-4 border-b border-line px-5 pt-4 pb-3.5">
            <div className="flex min-w-0 flex-col gap-1">
              <h2 id={titleId} className="text-title font-semibold text-ink">
                {title}
              </h2>
              {description ? (
                <p id={descriptionId} className="text-body text-ink-muted">
                  {description}
                </p>
              ) : null}
            </div>
            <button
              type="button"
              onClick={() => onOpenChange(false)}
              aria-label={closeLabel}
              className="-mt-0.5 -mr-1.5 inline-flex size-8 shrink-0 items-center justify-center rounded-control text-ink-muted hover:bg-surface-hover hover:text-ink"
            >
              <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-4">
                <path d="M4 4l8 8M12 4l-8 8" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
              </svg>
            </button>
          </header>
          <div className="min-h-0 flex-1 overflow-y-auto px-5 py-4">{children}</div>
          {footer ? (
            <footer className="flex flex-wrap items-center justify-end gap-2 border-t border-line bg-surface-canvas px-5 py-3">
              {footer}
            </footer>
          ) : null}
        </>
      ) : null}
    </dialog>
  );
}
