"use client";

import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { DataTable } from "@/components/ui/data-table";

export interface FleetRow {
  id: number;
  name: string;
  siteName: string;
  modality: string;
  modalityLabel: string;
  manufacturerModel: string;
  physicist: string;
}

const columns: ColumnDef<FleetRow, unknown>[] = [
  {
    id: "name",
    accessorKey: "name",
    header: "Scanner",
    cell: ({ row }) => (
      <Link href={`/scanners/${row.original.id}`} className="font-medium text-accent underline-offset-2 hover:underline">
        {row.original.name}
      </Link>
    ),
  },
  { accessorKey: "siteName", header: "Site" },
  { accessorKey: "modalityLabel", header: "Modality" },
  { accessorKey: "manufacturerModel", header: "Manufacturer and model" },
  { accessorKey: "physicist", header: "Responsible physicist" },
];

export function FleetTable({ rows }: { rows: FleetRow[] }) {
  return (
    <DataTable
      data={rows}
      columns={columns}
      caption="Fleet"
      filterLabel="Filter scanners"
      getRowId={(r) => String(r.id)}
      emptyTitle="No scanners"
      emptyDescription="Scanners appear here once an administrator adds them."
    />
  );
}
