"use client";

import { useId, useState } from "react";
import { Button, Table, TBody, Td, Th, THead, Tr, formatMetric } from "@/components/ui";

export interface ChartDataColumn {
  key: string;
  /** Header text with its unit, e.g. "Frequency (cycles/mm)". */
  label: string;
  digits: number;
}

export interface ChartDataTableProps {
  /** Accessible name of the table, e.g. "MTF samples". */
  caption: string;
  columns: ChartDataColumn[];
  rows: Record<string, number | null>[];
  /** Button text when hidden. Default "Show data table". */
  showLabel?: string;
}

/** A "Show data table" toggle under a chart: the same numbers as the chart, for screen readers and exact reading. */
export function ChartDataTable({ caption, columns, rows, showLabel = "Show data table" }: ChartDataTableProps) {
  const [open, setOpen] = useState(false);
  const panelId = useId();
  return (
    <div className="flex flex-col gap-2">
      <div>
        <Button variant="ghost" size="sm" aria-expanded={open} aria-controls={panelId} onClick={() => setOpen((v) => !v)}>
          {open ? "Hide data table" : showLabel}
        </Button>
      </div>
      <div id={panelId} hidden={!open} className="max-h-80 overflow-y-auto rounded-control border border-line">
        {open ? (
          <Table caption={caption} density="compact">
            <THead className="sticky top-0">
              <Tr>
                {columns.map((c) => (
                  <Th key={c.key} numeric>
                    {c.label}
                  </Th>
                ))}
              </Tr>
            </THead>
            <TBody>
              {rows.map((row, i) => (
                <Tr key={i}>
                  {columns.map((c) => (
                    <Td key={c.key} numeric>
                      {formatMetric(row[c.key], c.digits)}
                    </Td>
                  ))}
                </Tr>
              ))}
            </TBody>
          </Table>
        ) : null}
      </div>
    </div>
  );
}
