"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useRef, useState } from "react";
import { useDropzone } from "react-dropzone";
import { Button, Callout, Field, Input, Select, Spinner, StatusBadge, cn } from "@/components/ui";
import { ScannerOptionGroups } from "@/components/scanners/scanner-option-groups";
import { formatFileSize } from "./format";
import { METHOD_CHOICES, METHOD_LABELS, type MethodChoiceKey, type ResultStatus } from "./scan-types";

export interface UploadScannerOption {
  id: number;
  name: string;
  siteName: string;
  modality: string;
}

export interface UploadDropzoneProps {
  /** Upload to this scanner (scanner page). Without it a required "Scanner" select is shown. */
  scannerId?: number;
  /** Scanners offered in the select when `scannerId` is not given. */
  scanners?: UploadScannerOption[];
  /** Preselected scanner in the select (e.g. from `?scannerId=`). */
  defaultScannerId?: number;
  className?: string;
}

type RowState =
  | { kind: "queued" }
  | { kind: "uploading"; fraction: number }
  | { kind: "analysing" }
  | { kind: "done"; scanId: number; status: ResultStatus | null; headline: string | null; warningCount: number }
  | { kind: "needs-spacing"; message: string }
  | { kind: "duplicate"; message: string; existingScanId: number }
  | { kind: "error"; message: string };

interface UploadRow {
  key: string;
  file: File;
  method: MethodChoiceKey;
  note: string;
  /** Pixel spacing typed by the user, mm ("0.5" or "row,column"); sent only when not empty. */
  pixelSpacing: string;
  /** Spacing field shown: for PNG/TIFF names up front, for any file once the server asks for it. */
  askSpacing: boolean;
  state: RowState;
}

interface UploadAnswer {
  status: number;
  body: Record<string, unknown> | null;
}

const BUSY: RowState["kind"][] = ["uploading", "analysing"];

/** PNG and TIFF carry no pixel spacing of their own: offer the field before the first attempt. */
function looksLikeRaster(name: string): boolean {
  return /\.(png|tiff?)$/i.test(name);
}

/** Checks a typed spacing the way the server reads it: one number or "row,column", each in (0, 100] mm. */
function spacingProblem(text: string): string | null {
  const parts = text.trim().split(/[,\\\s]+/).filter(Boolean);
  if (parts.length === 0) return "Enter the pixel spacing in mm";
  if (parts.length > 2) return "Give one number, or row and column spacing separated by a comma";
  if (parts.some((p) => !(Number(p) > 0 && Number(p) <= 100))) return "Each spacing must be a number between 0 and 100 mm";
  return null;
}

/** POST /api/scans with upload progress (fetch cannot report upload progress, XMLHttpRequest can). */
function postScan(form: FormData, onProgress: (fraction: number) => void, onSent: () => void, register: (xhr: XMLHttpRequest) => void): Promise<UploadAnswer> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    register(xhr);
    xhr.open("POST", "/api/scans");
    xhr.setRequestHeader("accept", "application/json");
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    xhr.upload.onload = onSent;
    xhr.onload = () => {
      let body: Record<string, unknown> | null = null;
      try {
        const parsed: unknown = xhr.responseText ? JSON.parse(xhr.responseText) : null;
        body = parsed && typeof parsed === "object" ? (parsed as Record<string, unknown>) : null;
      } catch {
        body = null;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => reject(new Error("Could not reach the Halfmax server. Check your connection and try again."));
    xhr.onabort = () => reject(new Error("The upload was cancelled."));
    xhr.send(form);
  });
}

/** Turns the server's answer into the row's outcome. */
function outcomeOf(answer: UploadAnswer): RowState {
  const body = answer.body ?? {};
  if (answer.status === 201) {
    const scan = (body.scan ?? {}) as { id?: unknown };
    const analysis = (body.analysis ?? null) as { evaluation?: { status?: ResultStatus; headline?: string } | null; warnings?: unknown[] } | null;
    return {
      kind: "done",
      scanId: Number(scan.id),
      status: analysis?.evaluation?.status ?? null,
      headline: analysis?.evaluation?.headline ?? null,
      warningCount: Array.isArray(analysis?.warnings) ? analysis.warnings.length : 0,
    };
  }
  const message =
    typeof body.error === "string" && body.error
      ? body.error
      : answer.status === 401
        ? "Your session has ended. Sign in again, then retry."
        : `The server answered ${answer.status}. Try again.`;
  if (body.reason === "missing_pixel_spacing") return { kind: "needs-spacing", message };
  if (answer.status === 409 && typeof body.existingScanId === "number") return { kind: "duplicate", message, existingScanId: body.existingScanId };
  return { kind: "error", message };
}

let rowCounter = 0;

/**
 * Drop area for phantom images: queue one or more files, choose the analysis method (and a note) per file, then
 * upload them one after another (the analysis is CPU-heavy; one at a time keeps the server responsive). Shows the
 * upload progress, then "Analysing…", then the outcome. A single successful upload opens its result page.
 */
export function UploadDropzone({ scannerId, scanners = [], defaultScannerId, className }: UploadDropzoneProps) {
  const router = useRouter();
  const [rows, setRows] = useState<UploadRow[]>([]);
  const [chosenScanner, setChosenScanner] = useState<string>(
    defaultScannerId !== undefined && scanners.some((s) => s.id === defaultScannerId) ? String(defaultScannerId) : "",
  );
  const [scannerError, setScannerError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [running, setRunning] = useState(false);
  const active = useRef(new Set<XMLHttpRequest>());

  useEffect(() => {
    const requests = active.current;
    return () => {
      for (const xhr of requests) xhr.abort();
    };
  }, []);

  const targetScannerId = scannerId ?? (chosenScanner ? Number(chosenScanner) : null);

  const onDrop = useCallback((files: File[]) => {
    if (files.length === 0) return;
    setNotice(null);
    setRows((current) => {
      const known = new Set(current.map((r) => `${r.file.name}|${r.file.size}|${r.file.lastModified}`));
      const added: UploadRow[] = [];
      let skipped = 0;
      for (const file of files) {
        const id = `${file.name}|${file.size}|${file.lastModified}`;
        if (known.has(id)) {
          skipped++;
          continue;
        }
        known.add(id);
        added.push({ key: `upload-${++rowCounter}`, file, method: "auto", note: "", pixelSpacing: "", askSpacing: looksLikeRaster(file.name), state: { kind: "queued" } });
      }
      if (skipped > 0) setNotice(`${skipped === 1 ? "One file is" : `${skipped} files are`} already in the list and ${skipped === 1 ? "was" : "were"} not added again.`);
      return [...current, ...added];
    });
  }, []);

  const { getRootProps, getInputProps, isDragActive, open } = useDropzone({
    onDrop,
    multiple: true,
    noClick: true,
    noKeyboard: true,
    useFsAccessApi: false,
    disabled: running,
  });

  const update = useCallback((key: string, patch: Partial<UploadRow>) => {
    setRows((current) => current.map((r) => (r.key === key ? { ...r, ...patch } : r)));
  }, []);

  /** Uploads one row; resolves to the scan id on success. */
  const uploadRow = useCallback(
    async (row: UploadRow, scanner: number): Promise<number | null> => {
      const form = new FormData();
      form.set("file", row.file, row.file.name);
      form.set("scannerId", String(scanner));
      form.set("method", row.method);
      if (row.pixelSpacing.trim()) form.set("pixelSpacingMm", row.pixelSpacing.trim());
      if (row.note.trim()) form.set("note", row.note.trim());
      update(row.key, { state: { kind: "uploading", fraction: 0 } });
      let outcome: RowState;
      let request: XMLHttpRequest | null = null;
      try {
        const answer = await postScan(
          form,
          (fraction) => update(row.key, { state: { kind: "uploading", fraction } }),
          () => update(row.key, { state: { kind: "analysing" } }),
          (xhr) => {
            request = xhr;
            active.current.add(xhr);
          },
        );
        outcome = outcomeOf(answer);
      } catch (err) {
        outcome = { kind: "error", message: err instanceof Error ? err.message : "The upload failed. Try again." };
      } finally {
        if (request) active.current.delete(request);
      }
      update(row.key, { state: outcome, ...(outcome.kind === "needs-spacing" ? { askSpacing: true } : {}) });
      return outcome.kind === "done" ? outcome.scanId : null;
    },
    [update],
  );

  const run = useCallback(
    async (batch: UploadRow[], totalRows: number) => {
      if (targetScannerId === null) {
        setScannerError("Choose the scanner these images come from");
        return;
      }
      // A spacing typed in the wrong form is caught here rather than costing an upload.
      const ready = batch.filter((row) => {
        const problem = row.pixelSpacing.trim() ? spacingProblem(row.pixelSpacing) : null;
        if (problem) update(row.key, { state: { kind: "needs-spacing", message: problem } });
        return problem === null;
      });
      setRunning(true);
      const done: number[] = [];
      for (const row of ready) {
        const id = await uploadRow(row, targetScannerId);
        if (id !== null) done.push(id);
      }
      setRunning(false);
      // "After upload the user lands on the result": only when there is exactly one file, so a batch stays reviewable.
      if (totalRows === 1 && done.length === 1) router.push(`/scans/${done[0]}`);
    },
    [router, targetScannerId, update, uploadRow],
  );

  const queued = rows.filter((r) => r.state.kind === "queued");
  const finished = rows.filter((r) => r.state.kind === "done");
  const busy = running || rows.some((r) => BUSY.includes(r.state.kind));
  const selectedScanner = scanners.find((s) => String(s.id) === chosenScanner);

  return (
    <div className={cn("flex flex-col gap-4", className)} data-testid="upload-dropzone">
      {scannerId === undefined ? (
        <Field
          label="Scanner"
          required
          error={scannerError ?? undefined}
          hint={selectedScanner ? `${selectedScanner.siteName} · ${selectedScanner.modality}` : "The scanner the phantom images were acquired on."}
        >
          <Select
            value={chosenScanner}
            required
            disabled={busy}
            placeholder="Choose a scanner…"
            className="max-w-md"
            onChange={(event) => {
              setChosenScanner(event.target.value);
              setScannerError(null);
            }}
          >
            <ScannerOptionGroups scanners={scanners} />
          </Select>
        </Field>
      ) : null}

      <div
        {...getRootProps({
          className: cn(
            "flex flex-col items-center gap-3 rounded-card border-2 border-dashed px-6 py-8 text-center transition-colors duration-150",
            isDragActive ? "border-accent bg-accent-soft" : "border-line-strong bg-surface-canvas",
            running && "opacity-60",
          ),
        })}
      >
        <input {...getInputProps({ "aria-label": "Phantom image files" })} data-testid="upload-input" />
        <svg viewBox="0 0 32 32" aria-hidden="true" focusable="false" className="size-9 text-ink-subtle">
          <path d="M16 21V7m0 0-5 5m5-5 5 5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
          <path d="M6 20v4.5A1.5 1.5 0 0 0 7.5 26h17a1.5 1.5 0 0 0 1.5-1.5V20" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
        </svg>
        <p className="text-lead font-medium text-ink">{isDragActive ? "Release to add the files" : "Drop phantom images here"}</p>
        <p className="max-w-prose text-caption text-ink-muted">DICOM, PNG or TIFF; several files at once. The format is recognised from the content, not the file name.</p>
        <Button variant="secondary" onClick={open} disabled={running}>
          Choose files…
        </Button>
      </div>

      {notice ? (
        <Callout tone="info" role="status">
          {notice}
        </Callout>
      ) : null}

      {rows.length > 0 ? (
        <ul className="flex flex-col gap-3" aria-label="Files to upload">
          {rows.map((row) => (
            <UploadRowItem
              key={row.key}
              row={row}
              locked={busy}
              onChange={(patch) => update(row.key, patch)}
              onRemove={() => setRows((current) => current.filter((r) => r.key !== row.key))}
              onRetry={() => {
                if (row.askSpacing && row.state.kind === "needs-spacing") {
                  const problem = spacingProblem(row.pixelSpacing);
                  if (problem) {
                    update(row.key, { state: { kind: "needs-spacing", message: problem } });
                    return;
                  }
                }
                void run([row], rows.length);
              }}
            />
          ))}
        </ul>
      ) : null}

      {rows.length > 0 ? (
        <div className="flex flex-wrap items-center justify-between gap-3">
          <p className="text-caption text-ink-muted" aria-live="polite">
            {rows.length === 1 ? "1 file" : `${rows.length} files`}
            {finished.length > 0 ? ` · ${finished.length} analysed` : ""}
            {queued.length > 0 && finished.length + queued.length < rows.length ? ` · ${queued.length} waiting` : ""}
          </p>
          <div className="flex flex-wrap gap-2">
            {finished.length > 0 && !busy ? (
              <Button variant="ghost" onClick={() => setRows((current) => current.filter((r) => r.state.kind !== "done"))}>
                Clear analysed files
              </Button>
            ) : null}
            <Button
              onClick={() => void run(queued, rows.length)}
              disabled={queued.length === 0 && !running}
              loading={running}
              loadingText="Uploading…"
            >
              {queued.length > 1 ? `Upload and analyse ${queued.length} files` : "Upload and analyse"}
            </Button>
          </div>
        </div>
      ) : null}
    </div>
  );
}

interface UploadRowItemProps {
  row: UploadRow;
  locked: boolean;
  onChange: (patch: Partial<UploadRow>) => void;
  onRemove: () => void;
  onRetry: () => void;
}

function UploadRowItem({ row, locked, onChange, onRemove, onRetry }: UploadRowItemProps) {
  const { file, state } = row;
  const editable = !locked && state.kind !== "done" && state.kind !== "duplicate";
  const retryable = state.kind === "error" || state.kind === "needs-spacing";
  return (
    <li
      className="flex flex-col gap-3 rounded-card border border-line bg-surface px-4 py-3 shadow-card"
      data-testid="upload-row"
      data-state={state.kind}
    >
      <div className="flex flex-wrap items-start justify-between gap-x-4 gap-y-1">
        <div className="min-w-0">
          <p className="truncate font-medium text-ink" title={file.name}>
            {file.name}
          </p>
          <p className="text-caption text-ink-muted tnum">{formatFileSize(file.size)}</p>
        </div>
        {state.kind !== "uploading" && state.kind !== "analysing" && state.kind !== "done" ? (
          <Button variant="ghost" size="sm" onClick={onRemove} disabled={locked} aria-label={`Remove ${file.name} from the list`}>
            Remove
          </Button>
        ) : null}
      </div>

      {editable || retryable ? (
        <div className="grid gap-3 sm:grid-cols-[minmax(0,14rem)_minmax(0,1fr)]">
          <Field label="Analysis method">
            <Select controlSize="sm" value={row.method} disabled={!editable} onChange={(event) => onChange({ method: event.target.value as MethodChoiceKey })}>
              {METHOD_CHOICES.map((m) => (
                <option key={m} value={m}>
                  {METHOD_LABELS[m]}
                  {m === "auto" ? " (default)" : ""}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Note" hint="Optional, e.g. phantom position or protocol change.">
            <Input controlSize="sm" value={row.note} maxLength={2000} disabled={!editable} onChange={(event) => onChange({ note: event.target.value })} />
          </Field>
        </div>
      ) : null}

      {row.askSpacing && (editable || retryable) ? (
        <div className="flex flex-wrap items-end gap-3">
          <Field
            label="Pixel spacing (mm)"
            className="w-80"
            hint="One number for square pixels, or row,column (e.g. 0.5 or 0.5,0.6)."
            error={state.kind === "needs-spacing" && row.pixelSpacing.trim() !== "" ? spacingProblem(row.pixelSpacing) ?? undefined : undefined}
          >
            <Input controlSize="sm" inputMode="decimal" suffix="mm" value={row.pixelSpacing} disabled={!editable} onChange={(event) => onChange({ pixelSpacing: event.target.value })} />
          </Field>
        </div>
      ) : null}

      <RowOutcome state={state} fileName={file.name} onRetry={onRetry} locked={locked} />
    </li>
  );
}

function RowOutcome({ state, fileName, onRetry, locked }: { state: RowState; fileName: string; onRetry: () => void; locked: boolean }) {
  switch (state.kind) {
    case "queued":
      return <p className="text-caption text-ink-subtle">Waiting to upload.</p>;
    case "uploading": {
      const percent = Math.round(state.fraction * 100);
      return (
        <div className="flex items-center gap-3">
          <div
            role="progressbar"
            aria-label={`Upload of ${fileName}`}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={percent}
            className="h-2 min-w-0 flex-1 overflow-hidden rounded-full bg-surface-sunken"
          >
            <div className="h-full rounded-full bg-accent transition-[width] duration-150" style={{ width: `${percent}%` }} />
          </div>
          <span className="w-28 text-right text-caption text-ink-muted tnum">Uploading {percent} %</span>
        </div>
      );
    }
    case "analysing":
      return (
        <p className="flex items-center gap-2 text-caption text-ink-muted" role="status">
          <Spinner size="sm" decorative />
          Uploaded. Analysing… (decoding the image and measuring the spread function)
        </p>
      );
    case "done":
      return (
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1.5" role="status">
          {state.status ? <StatusBadge status={state.status} srPrefix="Result:" /> : null}
          <span className="text-body text-ink">{state.headline ?? "Analysed"}</span>
          {state.warningCount > 0 ? (
            <span className="text-caption text-warn">
              {state.warningCount} {state.warningCount === 1 ? "warning" : "warnings"}
            </span>
          ) : null}
          <Link href={`/scans/${state.scanId}`} className="font-medium text-accent underline underline-offset-2" data-testid="upload-result-link">
            Open result
          </Link>
        </div>
      );
    case "needs-spacing":
      return (
        <Callout
          tone="caution"
          role="alert"
          title="Pixel spacing needed"
          actions={
            <Button size="sm" onClick={onRetry} disabled={locked}>
              Retry with this spacing
            </Button>
          }
        >
          {state.message} Enter it above (it is on the phantom&apos;s or detector&apos;s data sheet, or in the scanner&apos;s export settings).
        </Callout>
      );
    case "duplicate":
      return (
        <Callout tone="info" role="alert" title="Already uploaded">
          {state.message}.{" "}
          <Link href={`/scans/${state.existingScanId}`} data-testid="upload-existing-link">
            Open the existing scan
          </Link>
        </Callout>
      );
    case "error":
      return (
        <Callout
          tone="error"
          title="Not analysed"
          actions={
            <Button size="sm" variant="secondary" onClick={onRetry} disabled={locked}>
              Retry
            </Button>
          }
        >
          {state.message}
        </Callout>
      );
  }
}
