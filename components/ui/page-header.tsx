import type { ReactNode } from "react";
import { cn } from "./cn";

export interface PageHeaderProps {
  /** The page's `<h1>`. */
  title: ReactNode;
  /** One or two sentences under the title. */
  description?: ReactNode;
  /** Small line above the title: breadcrumb links, modality, scanner id. */
  eyebrow?: ReactNode;
  /** Right-aligned buttons or links. */
  actions?: ReactNode;
  /** Row under the description for key facts (badges, "Last test 12 Mar 2026"). */
  meta?: ReactNode;
  className?: string;
}

/** Top of a page: h1, description, actions. Server-compatible. */
export function PageHeader({ title, description, eyebrow, actions, meta, className }: PageHeaderProps) {
  return (
    <header className={cn("flex flex-wrap items-end justify-between gap-x-6 gap-y-3 border-b border-line pb-5", className)}>
      <div className="flex min-w-0 max-w-3xl flex-col gap-1">
        {eyebrow ? <div className="text-caption font-medium text-ink-subtle">{eyebrow}</div> : null}
        <h1 className="text-heading font-semibold text-ink">{title}</h1>
        {description ? <p className="text-body text-ink-muted">{description}</p> : null}
        {meta ? <div className="mt-1.5 flex flex-wrap items-center gap-x-4 gap-y-1.5 text-caption text-ink-muted">{meta}</div> : null}
      </div>
      {actions ? <div className="flex shrink-0 flex-wrap items-center gap-2">{actions}</div> : null}
    </header>
  );
}
