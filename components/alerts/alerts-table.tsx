"use client";

import { createColumnHelper } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, type ReactNode } from "react";
import { DataTable, StatusBadge, StatusIcon } from "@/components/ui";
import { formatDateTime } from "@/lib/format/dates";
import type { AlertRow } from "./alert-types";
import { CAUSE_META, CauseLabel, proposalText } from "./cause-label";

export interface AlertsTableProps {
  alerts: AlertRow[];
  loading: boolean;
  onOpen: (alert: AlertRow) => void;
  toolbar?: ReactNode;
  caption: string;
  emptyTitle: string;
  emptyDescription?: string;
}

const col = createColumnHelper<AlertRow>();
const secondLine = "block text-caption text-ink-subtle";
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The alert list, newest activity first. Related facts share a column (scanner and site, cause and test, opened and
 * occurrences, acknowledgement and service count) so the table fits a laptop screen; the summary (or anywhere on the
 * row) opens the alert.
 */
export function AlertsTable({ alerts, loading, onOpen, toolbar, caption, emptyTitle, emptyDescription }: AlertsTableProps) {
  const columns = useMemo(
    () => [
      col.accessor((a) => `${a.scannerName} · ${a.siteName}`, {
        id: "scanner",
        header: "Scanner and site",
        meta: { wrap: true, cellClassName: "min-w-32 max-w-44" },
        cell: ({ row }) => (
          <>
            <Link href={`/scanners/${row.original.scannerId}`} className="font-medium text-accent underline-offset-2 hover:underline">
              {row.original.scannerName}
            </Link>
            <span className={secondLine}>{row.original.siteName}</span>
          </>
        ),
      }),
      col.accessor((a) => `${CAUSE_META[a.cause].label} · ${a.testName ?? ""}`, {
        id: "cause",
        header: "Cause and test",
        meta: { wrap: true, cellClassName: "min-w-32 max-w-44" },
        cell: ({ row }) => (
          <>
            <CauseLabel cause={row.original.cause} />
            <span className={secondLine}>{row.original.testName ?? "No test"}</span>
          </>
        ),
      }),
      col.accessor("summary", {
        header: "Summary",
        enableSorting: false,
        meta: { wrap: true, cellClassName: "min-w-48 max-w-sm" },
        // The summary is the way into the alert (the whole row also opens it, and rows take Enter/Space).
        cell: ({ row }) => (
          <button
            type="button"
            aria-haspopup="dialog"
            onClick={() => onOpen(row.original)}
            title={row.original.summary}
            className="line-clamp-2 text-left text-ink underline-offset-2 hover:text-accent hover:underline"
            data-testid="alert-summary"
          >
            {row.original.summary}
          </button>
        ),
      }),
      col.accessor("openedAt", {
        header: "Opened",
        cell: ({ row }) => (
          <>
            <span className="tnum">{formatDateTime(row.original.openedAt)}</span>
            <span className={`${secondLine} tnum`}>{plural(row.original.occurrences, "occurrence", "occurrences")}</span>
          </>
        ),
      }),
      col.accessor("state", {
        header: "State",
        meta: { wrap: true },
        cell: ({ row }) => (
          <>
            <StatusBadge status={row.original.state} />
            {row.original.resolutionProposedAt && row.original.state !== "resolved" ? (
              <span data-testid="ready-to-resolve" className="mt-1 flex max-w-36 items-start gap-1 text-caption font-medium text-pass">
                <StatusIcon status="pass" className="mt-px" />
                <span>{proposalText(row.original.cause).marker}</span>
              </span>
            ) : null}
          </>
        ),
      }),
      col.accessor((a) => a.acknowledgedByName ?? "", {
        id: "acknowledgedBy",
        header: "Acknowledged by",
        meta: { wrap: true, cellClassName: "max-w-40" },
        cell: ({ row }) => (
          <>
            {row.original.acknowledgedByName ?? <span className="text-ink-subtle">Not yet</span>}
            <span className={`${secondLine} tnum`}>{plural(row.original.serviceCount, "service action", "service actions")}</span>
          </>
        ),
      }),
    ],
    [onOpen],
  );

  return (
    <DataTable
      data={alerts}
      columns={columns}
      caption={caption}
      loading={loading}
      getRowId={(a) => String(a.id)}
      onRowClick={onOpen}
      toolbar={toolbar}
      filterPlaceholder="Scanner, site, cause, summary…"
      initialPageSize={25}
      emptyTitle={emptyTitle}
      emptyDescription={emptyDescription}
    />
  );
}
