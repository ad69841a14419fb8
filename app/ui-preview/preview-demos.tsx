"use client";

// Interactive parts of the living style sheet (/ui-preview). Synthetic data only; nothing is fetched or saved.
import { createColumnHelper } from "@tanstack/react-table";
import { useState } from "react";
import {
  Button,
  DataTable,
  Dialog,
  Field,
  Input,
  Metric,
  StatusBadge,
  Tab,
  TabList,
  TabPanel,
  Tabs,
  Textarea,
  formatMetric,
  type Status,
} from "@/components/ui";

interface DemoRow {
  id: string;
  scanner: string;
  modality: string;
  fwhmMm: number | null;
  mtf50: number | null;
  status: Status;
  testedOn: string;
}

const MODALITIES = ["CT", "PET", "Gamma camera", "X-ray", "Mammography"] as const;
const STATUSES: Status[] = ["pass", "pass", "warning", "pass", "action", "no-baseline", "pass", "overdue"];

// Deterministic synthetic rows, so server and client render the same table.
const ROWS: DemoRow[] = Array.from({ length: 37 }, (_, i) => ({
  id: `demo-${i + 1}`,
  scanner: `${MODALITIES[i % 5].split(" ")[0].toUpperCase()}-${String(i + 1).padStart(2, "0")}`,
  modality: MODALITIES[i % 5],
  fwhmMm: i % 9 === 5 ? null : 0.9 + ((i * 37) % 41) / 20,
  mtf50: i % 9 === 5 ? null : 2.8 + ((i * 53) % 47) / 10,
  status: STATUSES[i % STATUSES.length],
  testedOn: `2026-${String(1 + (i % 11)).padStart(2, "0")}-${String(1 + ((i * 7) % 27)).padStart(2, "0")}`,
}));

const col = createColumnHelper<DemoRow>();
const COLUMNS = [
  col.accessor("scanner", { header: "Scanner" }),
  col.accessor("modality", { header: "Modality" }),
  // Missing values as undefined so `sortUndefined: "last"` keeps them at the bottom in both directions.
  col.accessor((row) => row.fwhmMm ?? undefined, {
    id: "fwhmMm",
    header: "FWHM (mm)",
    meta: { numeric: true },
    sortUndefined: "last",
    cell: (c) => formatMetric(c.getValue(), 2),
  }),
  col.accessor((row) => row.mtf50 ?? undefined, {
    id: "mtf50",
    header: "MTF50 (lp/cm)",
    meta: { numeric: true },
    sortUndefined: "last",
    cell: (c) => formatMetric(c.getValue(), 1),
  }),
  col.accessor("status", { header: "Result", cell: (c) => <StatusBadge status={c.getValue()} size="sm" /> }),
  col.accessor("testedOn", { header: "Tested", meta: { muted: true } }),
];

export function DataTableDemo({ loading = false, empty = false }: { loading?: boolean; empty?: boolean }) {
  return (
    <DataTable
      data={empty ? [] : ROWS}
      columns={COLUMNS}
      caption="Demo scanners"
      loading={loading}
      initialPageSize={10}
      initialSorting={[{ id: "scanner", desc: false }]}
      getRowId={(row) => row.id}
      getRowHref={(row) => `#${row.id}`}
      emptyTitle="No scanners yet"
      emptyDescription="Add a scanner to start recording its acceptance baseline."
      filterable={!empty}
    />
  );
}

export function DialogDemo() {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Open dialog
      </Button>
      <Dialog
        open={open}
        onOpenChange={setOpen}
        title="Acknowledge alert"
        description="MTF50 on CT-03 is 12 % below its baseline (tolerance 10 %)."
        footer={
          <>
            <Button variant="ghost" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button onClick={() => setOpen(false)}>Acknowledge</Button>
          </>
        }
      >
        <Field label="Note" hint="Seen by everyone who opens this alert.">
          <Textarea placeholder="e.g. Tube replaced on 3 March; re-test booked." />
        </Field>
      </Dialog>
    </>
  );
}

export function LoadingButtonDemo() {
  const [busy, setBusy] = useState(false);
  return (
    <Button
      loading={busy}
      loadingText="Analysing…"
      onClick={() => {
        setBusy(true);
        window.setTimeout(() => setBusy(false), 1500);
      }}
    >
      Run analysis
    </Button>
  );
}

export function TabsDemo() {
  return (
    <Tabs defaultValue="mtf">
      <TabList label="Result views">
        <Tab value="mtf">MTF</Tab>
        <Tab value="lsf">LSF</Tab>
        <Tab value="raw">Image</Tab>
        <Tab value="audit" disabled>
          Audit
        </Tab>
      </TabList>
      <TabPanel value="mtf">
        <div className="grid grid-cols-3 gap-6">
          <Metric label="MTF50" value={4.18} unit="lp/cm" digits={2} />
          <Metric label="MTF10" value={7.03} unit="lp/cm" digits={2} />
          <Metric label="MTF at Nyquist" value={null} unit="" />
        </div>
      </TabPanel>
      <TabPanel value="lsf">
        <div className="grid grid-cols-3 gap-6">
          <Metric label="FWHM" value={1.234} unit="mm" />
          <Metric label="FWTM" value={2.251} unit="mm" />
          <Metric label="FWTM / FWHM" value={1.824} digits={3} />
        </div>
      </TabPanel>
      <TabPanel value="raw">
        <p className="text-ink-muted">The image panel would go here.</p>
      </TabPanel>
      <TabPanel value="audit">
        <p>Hidden.</p>
      </TabPanel>
    </Tabs>
  );
}

export function InvalidFieldDemo() {
  return (
    <Field label="Pixel spacing" hint="Row × column spacing from the DICOM header, in mm." error="Enter a spacing between 0.01 and 5 mm." required>
      <Input defaultValue="0" suffix="mm" inputMode="decimal" />
    </Field>
  );
}
