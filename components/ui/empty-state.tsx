import type { ReactNode } from "react";
import { cn } from "./cn";

export interface EmptyStateProps {
  /** Short statement, e.g. "No scans yet". */
  title: ReactNode;
  /** What to do next, e.g. "Upload an edge or wire image to start a baseline." */
  description?: ReactNode;
  /** Replace the default glyph (decorative). */
  icon?: ReactNode;
  /** A Button or link. */
  action?: ReactNode;
  /** Heading level of the title. Default "h3"; use "p" inside tables. */
  titleAs?: "h2" | "h3" | "h4" | "p";
  /** `compact` for table bodies and small cards. */
  size?: "default" | "compact";
  className?: string;
}

/** Calm placeholder for a list, table or chart with nothing to show. Server-compatible. */
export function EmptyState({ title, description, icon, action, titleAs: Title = "h3", size = "default", className }: EmptyStateProps) {
  return (
    <div className={cn("flex flex-col items-center text-center", size === "compact" ? "gap-1.5 px-4 py-8" : "gap-2 px-6 py-12", className)}>
      <span className="mb-1 inline-flex size-10 items-center justify-center rounded-full border border-line bg-surface-canvas text-ink-subtle" aria-hidden="true">
        {icon ?? (
          <svg viewBox="0 0 24 24" className="size-5" focusable="false">
            {/* a flat line-spread profile: nothing measured yet */}
            <path d="M3 17h18" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
            <path d="M5 17c3 0 4-9 7-9s4 9 7 9" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeDasharray="2 2.4" />
          </svg>
        )}
      </span>
      <Title className="text-lead font-semibold text-ink">{title}</Title>
      {description ? <p className="max-w-prose text-body text-ink-muted">{description}</p> : null}
      {action ? <div className="mt-2 flex flex-wrap justify-center gap-2">{action}</div> : null}
    </div>
  );
}
