import type { ComponentPropsWithoutRef, ReactNode } from "react";
import { cn } from "./cn";

/** Sort state of a column: `false` = sortable but unsorted. Leave Th's `sort` undefined for unsortable columns. */
export type SortDirection = "asc" | "desc" | false;

export interface TableProps extends ComponentPropsWithoutRef<"table"> {
  /** Accessible name of the table, rendered as `<caption>`. */
  caption?: ReactNode;
  /** Keep the caption for screen readers only (when a visible heading already says it). */
  captionHidden?: boolean;
  /** Tighter rows for long metric lists. */
  density?: "comfortable" | "compact";
  /** Classes for the scrolling wrapper (the table scrolls sideways on narrow screens). */
  wrapperClassName?: string;
}

/**
 * A styled `<table>` inside a horizontally scrollable wrapper.
 * Compose with THead, TBody, Tr, Th, Td. Server-compatible.
 */
export function Table({ caption, captionHidden = false, density = "comfortable", className, wrapperClassName, children, ...rest }: TableProps) {
  return (
    <div
      // Current Chromium and Firefox make an overflowing scroller keyboard-focusable by themselves.
      className={cn("relative w-full overflow-x-auto", wrapperClassName)}
      data-density={density}
    >
      <table {...rest} className={cn("group/table w-full border-collapse text-left text-body", className)} data-density={density}>
        {caption ? (
          <caption className={cn(captionHidden ? "sr-only" : "px-4 pb-2 text-left text-caption font-medium text-ink-muted caption-top")}>{caption}</caption>
        ) : null}
        {children}
      </table>
    </div>
  );
}

export function THead({ className, ...rest }: ComponentPropsWithoutRef<"thead">) {
  return <thead {...rest} className={cn("bg-surface-sunken", className)} />;
}

export function TBody({ className, ...rest }: ComponentPropsWithoutRef<"tbody">) {
  return <tbody {...rest} className={cn("divide-y divide-line", className)} />;
}

export interface TrProps extends ComponentPropsWithoutRef<"tr"> {
  /** Hover highlight and pointer cursor for clickable rows. */
  interactive?: boolean;
  selected?: boolean;
}

export function Tr({ interactive = false, selected = false, className, ...rest }: TrProps) {
  return (
    <tr
      {...rest}
      aria-selected={selected || undefined}
      className={cn(
        "align-middle",
        interactive && "cursor-pointer hover:bg-surface-hover focus-visible:-outline-offset-2",
        selected && "bg-accent-soft hover:bg-accent-soft",
        className,
      )}
    />
  );
}

/** Arrow pair showing the sort direction; purely visual (the header carries `aria-sort`). */
export function SortIndicator({ direction }: { direction: SortDirection }) {
  return (
    <svg viewBox="0 0 12 16" aria-hidden="true" focusable="false" className="size-3.5 shrink-0">
      <path d="M6 2.5 9.5 6.5h-7z" fill="currentColor" opacity={direction === "asc" ? 1 : 0.28} />
      <path d="M6 13.5 2.5 9.5h7z" fill="currentColor" opacity={direction === "desc" ? 1 : 0.28} />
    </svg>
  );
}

export interface ThProps extends ComponentPropsWithoutRef<"th"> {
  /** Column sort state; sets `aria-sort` and shows the indicator. Undefined = not sortable. */
  sort?: SortDirection;
  /** Makes the header a button that calls this (client components only). */
  onSort?: () => void;
  /** Right-align for numbers. */
  numeric?: boolean;
}

/** Column (or row, with `scope="row"`) header. Sortable headers get a real button. */
export function Th({ sort, onSort, numeric = false, scope = "col", className, children, ...rest }: ThProps) {
  const ariaSort = sort === undefined ? undefined : sort === "asc" ? "ascending" : sort === "desc" ? "descending" : "none";
  const content = (
    <>
      <span>{children}</span>
      {sort !== undefined ? <SortIndicator direction={sort} /> : null}
    </>
  );
  return (
    <th
      {...rest}
      scope={scope}
      aria-sort={ariaSort}
      className={cn(
        "border-b border-line-strong px-4 text-caption font-semibold whitespace-nowrap text-ink-muted",
        "h-9 group-data-[density=compact]/table:h-8",
        numeric ? "text-right" : "text-left",
        className,
      )}
    >
      {onSort ? (
        <button
          type="button"
          onClick={onSort}
          className={cn(
            "-mx-1.5 inline-flex items-center gap-1 rounded-chip px-1.5 py-0.5 hover:bg-surface-hover hover:text-ink",
            numeric && "flex-row-reverse",
            sort ? "text-ink" : undefined,
          )}
        >
          {content}
        </button>
      ) : (
        <span className={cn("inline-flex items-center gap-1", numeric && "flex-row-reverse")}>{content}</span>
      )}
    </th>
  );
}

export interface TdProps extends ComponentPropsWithoutRef<"td"> {
  /** Right-aligned tabular figures for measurements. */
  numeric?: boolean;
  /** Secondary text colour (e.g. dates, ids). */
  muted?: boolean;
  /** Let long text (notes, descriptions) wrap; by default cells stay on one line and the table scrolls sideways. */
  wrap?: boolean;
}

export function Td({ numeric = false, muted = false, wrap = false, className, ...rest }: TdProps) {
  return (
    <td
      {...rest}
      className={cn(
        "px-4 py-2.5 group-data-[density=compact]/table:py-1.5",
        numeric && "text-right tnum",
        wrap ? "min-w-48" : "whitespace-nowrap",
        muted ? "text-ink-muted" : "text-ink",
        className,
      )}
    />
  );
}
