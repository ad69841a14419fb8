"use client";

import type { ColumnDef } from "@tanstack/react-table";
import { Callout, Card, CardDescription, CardHeader, CardTitle, StatusBadge } from "@/components/ui";
import { DataTable } from "@/components/ui/data-table";
import { errorMessage } from "@/lib/api/fetch-json";
import { describeRange, type DateRange } from "./date-range-picker";
import { formatDate, formatDateTime, formatValue, METHOD_NAMES, metricTitle } from "./qa-format";
import type { ScanListItemJson } from "./qa-types";
import { MAX_SCAN_ROWS, useScannerScans } from "./use-scanner-queries";

const STATUS_RANK = { action: 3, warning: 2, pass: 1, "no-baseline": 0 } as const;

const numberColumn = (key: "fwhmMm" | "mtf50" | "mtf10"): ColumnDef<ScanListItemJson, any> => ({
  id: key,
  header: metricTitle(key),
  accessorFn: (s) => s[key] ?? -Infinity,
  cell: ({ row }) => formatValue(key, row.original[key]),
  meta: { numeric: true },
  enableGlobalFilter: false,
});

const columns: ColumnDef<ScanListItemJson, any>[] = [
  {
    id: "acquiredAt",
    header: "Test date (UTC)",
    accessorFn: (s) => new Date(s.acquiredAt).getTime(),
    cell: ({ row }) => <span title={formatDateTime(row.original.acquiredAt)}>{formatDate(row.original.acquiredAt)}</span>,
    enableGlobalFilter: false,
  },
  {
    id: "test",
    header: "Test",
    accessorFn: (s) => s.testName ?? "No routine test",
    cell: ({ getValue }) => (
      <span className="block max-w-52 truncate" title={getValue<string>()}>
        {getValue<string>()}
      </span>
    ),
  },
  { id: "method", header: "Method", accessorFn: (s) => METHOD_NAMES[s.method] ?? s.method },
  {
    id: "status",
    header: "Status",
    accessorFn: (s) => STATUS_RANK[s.status],
    cell: ({ row }) => <StatusBadge status={row.original.status} size="sm" />,
    enableGlobalFilter: false,
  },
  numberColumn("fwhmMm"),
  numberColumn("mtf50"),
  numberColumn("mtf10"),
  {
    id: "signedOff",
    header: "Signed off",
    accessorFn: (s) => (s.signedOffAt ? new Date(s.signedOffAt).getTime() : 0),
    cell: ({ row }) => (row.original.signedOffAt ? formatDate(row.original.signedOffAt) : <span className="text-ink-subtle">Not yet</span>),
    meta: { muted: true },
    enableGlobalFilter: false,
  },
];

/** Every result of the scanner in the period, newest first: the keyboard-accessible counterpart of the trend chart. */
export function ScanResultsTable({ scannerId, range }: { scannerId: number; range: DateRange }) {
  const scans = useScannerScans(scannerId, range);
  const total = scans.data?.total ?? 0;
  return (
    <Card aria-labelledby="results-title" data-testid="results-table">
      <CardHeader>
        <CardTitle id="results-title">Results</CardTitle>
        <CardDescription>
          {scans.data ? `${total} ${total === 1 ? "result" : "results"}, ${describeRange(range)}.` : `Results, ${describeRange(range)}.`} Open a row for its curves, evaluation and sign-off.
        </CardDescription>
      </CardHeader>
      {scans.error ? (
        <div className="p-4">
          <Callout tone="error" title="The results could not be loaded">{errorMessage(scans.error)}</Callout>
        </div>
      ) : (
        <>
          {total > MAX_SCAN_ROWS ? (
            <p className="px-4 pt-3 text-caption text-ink-muted">Showing the newest {MAX_SCAN_ROWS} of {total}; narrow the period to see older ones.</p>
          ) : null}
          <DataTable
            data={scans.data?.scans ?? []}
            columns={columns}
            caption="Results of this scanner"
            loading={scans.isPending}
            filterLabel="Filter results"
            filterPlaceholder="Test or method"
            getRowId={(s) => String(s.id)}
            getRowHref={(s) => `/scans/${s.id}`}
            linkColumnId="acquiredAt"
            initialSorting={[{ id: "acquiredAt", desc: true }]}
            initialPageSize={10}
            density="compact"
            emptyTitle="No results in this period"
            emptyDescription="Widen the period, or add results with the upload area."
          />
        </>
      )}
    </Card>
  );
}
