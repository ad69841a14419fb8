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
      <span className="mb-1 inline-flex size-12 items-center justify-center rounded-full border border-line bg-surface-canvas text-ink-subtle" aria-hidden="true">
        {icon ?? (
          <svg viewBox="0 0 24 24" className="size-7" focusable="false">
            {/* empty axes with a dashed spread profile: nothing measured yet */}
            <path d="M4 3.5v16h16.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
            <path d="M6.5 17.5c2.6 0 3.4-10.5 6.5-10.5s3.9 10.5 6.5 10.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeDasharray="0.1 2.6" />
          </svg>
        )}
      </span>
      <Title className="text-lead font-semibold text-ink">{title}</Title>
      {description ? <p className="max-w-prose text-body text-ink-muted">{description}</p> : null}
      {action ? <div className="mt-2 flex flex-wrap justify-center gap-2">{action}</div> : null}
    </div>
  );
}
