"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { UploadDropzone } from "@/components/scans/upload-dropzone";
import { Button, Card, CardBody, CardDescription, CardHeader, CardTitle, buttonClasses } from "@/components/ui";
import { BaselinePanel } from "./baseline-panel";
import { DateRangePicker, describeRange, presetRange, rangeQuery, type DateRange } from "./date-range-picker";
import { qaKeys } from "./qa-types";
import { ScanResultsTable } from "./scan-results-table";
import { SchedulePanel } from "./schedule-panel";
import { TolerancePanel } from "./tolerance-panel";
import { TrendCard } from "./trend-card";

export interface ScannerPermissions {
  /** Download the PDF report and the CSV export (leads, physicists, admins). */
  viewReports: boolean;
  uploadScans: boolean;
  manageSchedules: boolean;
  manageBaselines: boolean;
  manageTolerances: boolean;
}

export interface ScannerWorkspaceProps {
  scannerId: number;
  scannerName: string;
  can: ScannerPermissions;
  /** User id → name, for "set by" in the baseline history. */
  people: Record<number, string>;
}

/**
 * Everything below the scanner page's header: one period shared by the report links, the trend and the results
 * table; the upload area; schedule, baselines and tolerances. Edit controls follow `can` (the API checks the same
 * permissions, so hiding them is only a courtesy).
 */
export function ScannerWorkspace({ scannerId, scannerName, can, people }: ScannerWorkspaceProps) {
  const [range, setRange] = useState<DateRange>(() => presetRange("1y"));
  const queryClient = useQueryClient();
  const badRange = Boolean(range.from && range.to && range.from > range.to);
  const q = rangeQuery(range);

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4 rounded-card border border-line bg-surface px-4 py-3 shadow-card">
        <DateRangePicker value={range} onChange={setRange} />
        {can.viewReports ? (
          <div className="flex flex-wrap items-center gap-2" aria-label={`Downloads for ${describeRange(range)}`} role="group">
            <a
              href={`/api/scanners/${scannerId}/report${q}`}
              className={buttonClasses({ variant: "secondary", size: "sm" })}
              aria-disabled={badRange || undefined}
              onClick={(e) => badRange && e.preventDefault()}
              data-testid="report-link"
            >
              Download report (PDF)
            </a>
            <a
              href={`/api/scanners/${scannerId}/results.csv${q}`}
              download
              className={buttonClasses({ variant: "secondary", size: "sm" })}
              aria-disabled={badRange || undefined}
              onClick={(e) => badRange && e.preventDefault()}
              data-testid="csv-link"
            >
              Export results (CSV)
            </a>
          </div>
        ) : null}
      </div>

      <TrendCard scannerId={scannerId} range={range} />
      <ScanResultsTable scannerId={scannerId} range={range} />

      {can.uploadScans ? (
        <Card aria-labelledby="upload-title" data-testid="upload-card">
          <CardHeader
            actions={
              <Button
                variant="ghost"
                size="sm"
                onClick={() => {
                  void queryClient.invalidateQueries({ queryKey: qaKeys.scanner(scannerId) });
                  void queryClient.invalidateQueries({ queryKey: ["scans"] });
                }}
              >
                Refresh trend and results
              </Button>
            }
          >
            <CardTitle id="upload-title">Add results</CardTitle>
            <CardDescription>Phantom images for {scannerName}: each file is analysed at once and compared with the baseline.</CardDescription>
          </CardHeader>
          <CardBody>
            <UploadDropzone scannerId={scannerId} />
          </CardBody>
        </Card>
      ) : null}

      <div className="grid items-start gap-6 2xl:grid-cols-2">
        <SchedulePanel scannerId={scannerId} canEdit={can.manageSchedules} />
        <BaselinePanel scannerId={scannerId} canEdit={can.manageBaselines} people={people} />
      </div>
      <TolerancePanel scannerId={scannerId} canEdit={can.manageTolerances} />
    </div>
  );
}
