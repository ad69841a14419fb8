"use client";

import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type PaginationState,
  type Row,
  type RowData,
  type SortingState,
} from "@tanstack/react-table";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState, type KeyboardEvent, type MouseEvent, type ReactNode } from "react";
import { Button } from "./button";
import { cn } from "./cn";
import { EmptyState } from "./empty-state";
import { Input } from "./input";
import { Select } from "./select";
import { Skeleton } from "./skeleton";
import { Table, TBody, Td, Th, THead, Tr } from "./table-shell";

declare module "@tanstack/react-table" {
  // Halfmax column options, set per column as `meta: { numeric: true }`.
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Right-align header and cells, tabular figures. */
    numeric?: boolean;
    /** Secondary text colour for the cells. */
    muted?: boolean;
    /** Let long cell text wrap (default: one line, the table scrolls sideways). */
    wrap?: boolean;
    headerClassName?: string;
    cellClassName?: string;
  }
}

const INTERACTIVE = "a, button, input, select, textarea, label, summary, [role='button'], [role='link'], [contenteditable='true']";

export interface DataTableProps<T> {
  data: T[];
  /** TanStack column definitions (`createColumnHelper<T>()` helps). Set `meta.numeric` for measurement columns. */
  // `any`: TanStack's own advice for arrays of columns whose values differ in type.
  columns: ColumnDef<T, any>[];
  /** Accessible name of the table (its `<caption>`), e.g. "Scans of CT-2". */
  caption: string;
  /** Show the caption visibly. Default false (a card title usually says it already). */
  captionVisible?: boolean;
  /** Shows skeleton rows and sets `aria-busy`. */
  loading?: boolean;
  skeletonRows?: number;
  /** Global text filter over string and number columns. Default true. */
  filterable?: boolean;
  /** Visible label of the filter box. Default "Filter". */
  filterLabel?: string;
  filterPlaceholder?: string;
  initialSorting?: SortingState;
  /** Default 25. */
  initialPageSize?: number;
  /** Default [10, 25, 50, 100]. */
  pageSizeOptions?: number[];
  /**
   * Makes each row a link: the cell of `linkColumnId` (default: the first column) becomes a real
   * `<Link>` for keyboard and screen-reader users, and a click anywhere else on the row follows it
   * (Ctrl/⌘-click opens a new tab).
   */
  getRowHref?: (row: T) => string | undefined;
  linkColumnId?: string;
  /** Click/Enter/Space on a row (rows become focusable). Prefer getRowHref when the action is navigation. */
  onRowClick?: (row: T) => void;
  /** Stable row key, e.g. `(scan) => String(scan.id)`. Default: the index. */
  getRowId?: (row: T, index: number) => string;
  /** Extra controls on the right of the filter row (e.g. a modality Select or an export Button). */
  toolbar?: ReactNode;
  /** Custom content when `data` is empty (not when the filter hides everything). */
  empty?: ReactNode;
  emptyTitle?: string;
  emptyDescription?: string;
  density?: "comfortable" | "compact";
  className?: string;
}

/**
 * Sortable, filterable, paginated table for client-side data (up to a few thousand rows).
 * Column definitions hold functions, so render it from a "use client" component, not directly
 * from a server page: e.g. components/scans/scan-table.tsx defines the columns and renders
 * `<DataTable data={scans} columns={columns} caption="Scans" getRowHref={(s) => `/scans/${s.id}`} />`.
 */
export function DataTable<T>({
  data,
  columns,
  caption,
  captionVisible = false,
  loading = false,
  skeletonRows = 5,
  filterable = true,
  filterLabel = "Filter",
  filterPlaceholder = "Type to filter rows",
  initialSorting = [],
  initialPageSize = 25,
  pageSizeOptions = [10, 25, 50, 100],
  getRowHref,
  linkColumnId,
  onRowClick,
  getRowId,
  toolbar,
  empty,
  emptyTitle = "Nothing here yet",
  emptyDescription,
  density = "comfortable",
  className,
}: DataTableProps<T>) {
  const router = useRouter();
  const filterId = useId();
  const pageSizeId = useId();
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState("");
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: initialPageSize });

  const table = useReactTable<T>({
    data,
    columns,
    state: { sorting, globalFilter, pagination },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    onPaginationChange: setPagination,
    getRowId,
    enableMultiSort: false,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  });

  const leafColumns = table.getVisibleLeafColumns();
  const linkColumn = linkColumnId ?? leafColumns[0]?.id;
  const filteredCount = table.getFilteredRowModel().rows.length;
  const { pageIndex, pageSize } = table.getState().pagination;
  const pageCount = Math.max(1, table.getPageCount());
  const firstShown = filteredCount === 0 ? 0 : pageIndex * pageSize + 1;
  const lastShown = Math.min(filteredCount, (pageIndex + 1) * pageSize);
  const filtering = globalFilter.trim() !== "";
  const showPager = pageCount > 1;
  const showPageSize = data.length > Math.min(...pageSizeOptions, pageSize);
  const sizes = pageSizeOptions.includes(pageSize) ? pageSizeOptions : [...pageSizeOptions, pageSize].sort((a, b) => a - b);

  const rowHandlers = (row: Row<T>) => {
    const href = getRowHref?.(row.original);
    if (href) {
      return {
        interactive: true,
        onClick: (event: MouseEvent<HTMLTableRowElement>) => {
          if ((event.target as HTMLElement).closest(INTERACTIVE)) return; // the cell's own link/button handles it
          if (window.getSelection()?.toString()) return; // the user is selecting text to copy
          if (event.metaKey || event.ctrlKey) window.open(href, "_blank", "noopener");
          else router.push(href);
        },
      };
    }
    if (onRowClick) {
      return {
        interactive: true,
        tabIndex: 0,
        onClick: (event: MouseEvent<HTMLTableRowElement>) => {
          if ((event.target as HTMLElement).closest(INTERACTIVE)) return;
          onRowClick(row.original);
        },
        onKeyDown: (event: KeyboardEvent<HTMLTableRowElement>) => {
          if (event.target !== event.currentTarget) return;
          if (event.key === "Enter" || event.key === " ") {
            event.preventDefault();
            onRowClick(row.original);
          }
        },
      };
    }
    return { interactive: false };
  };

  let body: ReactNode;
  if (loading) {
    body = Array.from({ length: skeletonRows }, (_, r) => (
      <Tr key={`skeleton-${r}`} aria-hidden="true">
        {leafColumns.map((column, c) => (
          <Td key={column.id} numeric={column.columnDef.meta?.numeric}>
            <Skeleton className={cn("h-3.5", column.columnDef.meta?.numeric ? "ml-auto w-14" : c === 0 ? "w-32" : "w-20")} />
          </Td>
        ))}
      </Tr>
    ));
  } else if (data.length === 0 || filteredCount === 0) {
    body = (
      <Tr>
        <Td colSpan={Math.max(1, leafColumns.length)} wrap className="p-0">
          {data.length === 0 ? (
            (empty ?? <EmptyState size="compact" titleAs="p" title={emptyTitle} description={emptyDescription} />)
          ) : (
            <EmptyState
              size="compact"
              titleAs="p"
              title={`No rows match “${globalFilter.trim()}”`}
              description="Check the spelling or clear the filter."
              action={
                <Button variant="secondary" size="sm" onClick={() => setGlobalFilter("")}>
                  Clear filter
                </Button>
              }
            />
          )}
        </Td>
      </Tr>
    );
  } else {
    body = table.getRowModel().rows.map((row) => {
      const { interactive, ...handlers } = rowHandlers(row);
      const href = getRowHref?.(row.original);
      return (
        <Tr key={row.id} interactive={interactive} {...handlers}>
          {row.getVisibleCells().map((cell) => {
            const meta = cell.column.columnDef.meta;
            const content = flexRender(cell.column.columnDef.cell, cell.getContext());
            return (
              <Td key={cell.id} numeric={meta?.numeric} muted={meta?.muted} wrap={meta?.wrap} className={meta?.cellClassName}>
                {href && cell.column.id === linkColumn ? (
                  <Link href={href} className="font-medium text-ink underline-offset-2 hover:text-accent hover:underline">
                    {content}
                  </Link>
                ) : (
                  content
                )}
              </Td>
            );
          })}
        </Tr>
      );
    });
  }

  return (
    <div className={cn("flex min-w-0 flex-col", className)}>
      {filterable || toolbar ? (
        <div className="flex flex-wrap items-end justify-between gap-3 px-4 py-3">
          {filterable ? (
            <div className="flex w-full max-w-xs flex-col gap-1">
              <label htmlFor={filterId} className="text-caption font-medium text-ink-muted">
                {filterLabel}
              </label>
              <Input
                id={filterId}
                type="search"
                controlSize="sm"
                value={globalFilter}
                placeholder={filterPlaceholder}
                onChange={(event) => setGlobalFilter(event.target.value)}
                autoComplete="off"
                spellCheck={false}
              />
            </div>
          ) : (
            <span />
          )}
          {toolbar ? <div className="flex flex-wrap items-center gap-2">{toolbar}</div> : null}
        </div>
      ) : null}

      <Table caption={caption} captionHidden={!captionVisible} density={density} aria-busy={loading || undefined} className="border-t border-line">
        <THead>
          {table.getHeaderGroups().map((group) => (
            <Tr key={group.id}>
              {group.headers.map((header) => {
                const meta = header.column.columnDef.meta;
                const canSort = header.column.getCanSort();
                return (
                  <Th
                    key={header.id}
                    colSpan={header.colSpan > 1 ? header.colSpan : undefined}
                    numeric={meta?.numeric}
                    sort={canSort && !header.isPlaceholder ? header.column.getIsSorted() : undefined}
                    onSort={canSort && !header.isPlaceholder ? () => header.column.toggleSorting() : undefined}
                    className={meta?.headerClassName}
                  >
                    {header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext())}
                  </Th>
                );
              })}
            </Tr>
          ))}
        </THead>
        <TBody>{body}</TBody>
      </Table>

      <div className="flex flex-wrap items-center justify-between gap-x-6 gap-y-2 border-t border-line px-4 py-2.5 text-caption text-ink-muted">
        <p className="tnum" aria-live="polite">
          {loading
            ? "Loading rows…"
            : filteredCount === 0
              ? filtering
                ? "No matching rows"
                : "No rows"
              : `Showing ${firstShown}–${lastShown} of ${filteredCount}${filtering ? ` matching (${data.length} in all)` : ""}`}
        </p>
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          {showPageSize ? (
            <div className="flex items-center gap-2">
              <label htmlFor={pageSizeId}>Rows per page</label>
              <Select
                id={pageSizeId}
                controlSize="sm"
                className="w-20"
                value={String(pageSize)}
                onChange={(event) => table.setPageSize(Number(event.target.value))}
              >
                {sizes.map((size) => (
                  <option key={size} value={size}>
                    {size}
                  </option>
                ))}
              </Select>
            </div>
          ) : null}
          {showPager ? (
            <>
              <p className="tnum">
                Page {Math.min(pageIndex + 1, pageCount)} of {pageCount}
              </p>
              <nav aria-label={`Pages of ${caption}`} className="flex items-center gap-1">
                <PagerButton label="First page" disabled={!table.getCanPreviousPage()} onClick={() => table.firstPage()} d="M10.5 4 6.5 8l4 4M4.5 4v8" />
                <PagerButton label="Previous page" disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()} d="M10 4 6 8l4 4" />
                <PagerButton label="Next page" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()} d="M6 4l4 4-4 4" />
                <PagerButton label="Last page" disabled={!table.getCanNextPage()} onClick={() => table.lastPage()} d="M5.5 4l4 4-4 4M11.5 4v8" />
              </nav>
            </>
          ) : null}
        </div>
      </div>
    </div>
  );
}

function PagerButton({ label, disabled, onClick, d }: { label: string; disabled: boolean; onClick: () => void; d: string }) {
  return (
    <Button variant="secondary" size="icon" aria-label={label} title={label} disabled={disabled} onClick={onClick}>
      <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-4">
        <path d={d} fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    </Button>
  );
}
