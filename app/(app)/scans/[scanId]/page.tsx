// GET /scans/{scanId} – one scan's result: image and ROI, MTF and spread curves, metrics against the baseline,
// resolution preview, warnings, DICOM attributes, analysis history and sign-off
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { cache, type ReactNode } from "react";
import { getScanDetail } from "@/db/queries/scans";
import { AnalysisHistory } from "@/components/scans/analysis-history";
import { DicomAttributes } from "@/components/scans/dicom-attributes";
import { formatFileSize, formatScanDate, formatScanDateTime } from "@/components/scans/format";
import { MetricsTable } from "@/components/scans/metrics-table";
import { ScanImageViewer } from "@/components/scans/scan-image-viewer";
import { ResolutionPreviewPanel, ScanCurvesPanel } from "@/components/scans/scan-result-panels";
import { METHOD_LABELS, curveFrequencies, type AnalysisJsonView, type ScanJsonView } from "@/components/scans/scan-types";
import { ScanWarnings } from "@/components/scans/scan-warnings";
import { SignOffPanel } from "@/components/scans/sign-off-panel";
import {
  Card,
  CardBody,
  CardDescription,
  CardHeader,
  CardTitle,
  ClinicalCaution,
  EmptyState,
  PageHeader,
  STATUS_LABELS,
  StatusBadge,
  buttonClasses,
  formatMetric,
} from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { can } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { scanToJson } from "@/lib/scans/scan-json";

type Params = Promise<{ scanId: string }>;

/** The signed-in user and the scan as plain JSON (the API's shape); 404 for a bad id or a scan the user cannot see. */
const loadScan = cache(async (rawId: string) => {
  const user = await requirePagePermission("viewFleet");
  const id = Number(rawId);
  if (!/^\d+$/.test(rawId) || !Number.isSafeInteger(id) || id <= 0) notFound();
  try {
    const detail = await getScanDetail(id, user);
    // Plain JSON for the client components: dates become ISO strings, exactly as GET /api/scans/{id} sends them.
    const view = JSON.parse(JSON.stringify(scanToJson(detail))) as ScanJsonView;
    return { user, view };
  } catch (err) {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  }
});

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { scanId } = await params;
  const { view } = await loadScan(scanId);
  return { title: `${view.scan.scannerName}, ${formatScanDate(view.scan.acquiredAt)}` };
}

export default async function ScanResultPage({ params }: { params: Params }) {
  const { scanId } = await params;
  const { user, view } = await loadScan(scanId);
  const { scan, analysis, history } = view;
  const title = `${scan.testName ?? (analysis ? METHOD_LABELS[analysis.method] : "Scan")} — ${formatScanDate(scan.acquiredAt)}`;
  const status = analysis?.evaluation?.status ?? analysis?.status ?? null;

  return (
    <div className="space-y-6">
      <PageHeader
        eyebrow={
          <nav aria-label="Breadcrumb" className="flex flex-wrap items-center gap-1.5">
            <Link href="/scanners" className="hover:text-accent hover:underline">
              Scanners
            </Link>
            <span aria-hidden="true">/</span>
            <Link href={`/scanners/${scan.scannerId}`} className="hover:text-accent hover:underline">
              {scan.scannerName}
            </Link>
            <span aria-hidden="true">·</span>
            <span>{scan.siteName}</span>
          </nav>
        }
        title={title}
        description={
          analysis && status ? (
            <span className="flex flex-wrap items-center gap-2" data-testid="scan-headline">
              <StatusBadge status={status} srPrefix="Overall result:" />
              <span className="text-ink">{analysis.evaluation?.headline ?? STATUS_LABELS[status]}</span>
            </span>
          ) : (
            "This scan has no analysis."
          )
        }
        meta={
          <>
            <span>
              Acquired <time dateTime={scan.acquiredAt}>{formatScanDateTime(scan.acquiredAt)}</time>
            </span>
            {analysis ? <span>Method: {METHOD_LABELS[analysis.method]}</span> : null}
            {analysis ? <span>Revision {analysis.revision}</span> : null}
            <span>
              Uploaded by {scan.uploadedBy}, <time dateTime={scan.uploadedAt}>{formatScanDateTime(scan.uploadedAt)}</time>
            </span>
          </>
        }
        actions={
          <>
            <a href={`/api/scans/${scan.id}/file`} download className={buttonClasses({ variant: "secondary" })}>
              Download original
            </a>
            {can(user.role, "uploadScans") ? (
              <Link href={`/scans/new?scannerId=${scan.scannerId}`} className={buttonClasses({ variant: "ghost" })}>
                Add scans
              </Link>
            ) : null}
          </>
        }
      />

      {analysis ? <AnalysisSections view={view} analysis={analysis} canReanalyse={can(user.role, "reanalyseScans")} /> : (
        <EmptyState title="No analysis stored" description="The scan was stored without a result. A physicist can re-run the analysis." />
      )}

      <Section id="history" title="Analysis history" description="Every revision is kept; the newest is current.">
        <AnalysisHistory history={history} />
      </Section>

      <Section id="sign-off" title="Sign-off">
        <SignOffPanel
          scanId={scan.id}
          canSignOff={can(user.role, "signOffScans")}
          signOff={scan.signOff ? { by: scan.signOff.by, at: formatScanDateTime(scan.signOff.at), note: scan.signOff.note } : null}
        />
      </Section>

      <ClinicalCaution />
    </div>
  );
}

function AnalysisSections({ view, analysis, canReanalyse }: { view: ScanJsonView; analysis: AnalysisJsonView; canReanalyse: boolean }) {
  const { scan } = view;
  const series = (c: AnalysisJsonView["mtfCurves"][string]) => (c ? { frequency: curveFrequencies(c), value: c.value } : undefined);
  const lsfCurve = analysis.spread.find((c) => c.kind === "lsf");
  const psfCurve = analysis.spread.find((c) => c.id === "psf-x") ?? analysis.spread.find((c) => c.kind === "psf");
  const previewSource = lsfCurve ?? psfCurve ?? null;
  const lsfNote = lsfCurve
    ? "The blur is this result's measured line spread function."
    : psfCurve
      ? "For a point source the x profile through the PSF peak stands in for the LSF (the preview normalises it to unit area): exact for a Gaussian PSF, whose profiles and projections share one σ; an approximation otherwise."
      : "";

  return (
    <>
      <div className="grid items-start gap-6 xl:grid-cols-2">
        <Section id="image" title="Image and region of interest">
          <ScanImageViewer scanId={scan.id} roi={analysis.roi} method={analysis.method} pixelSpacingMm={analysis.pixelSpacingMm} canReanalyse={canReanalyse} />
        </Section>
        <Section id="curves" title="Resolution curves">
          <ScanCurvesPanel
            scannerId={scan.scannerId}
            testId={scan.testId}
            method={analysis.method}
            mtf={{ frequency: curveFrequencies(analysis.mtf), value: analysis.mtf.value }}
            cuts={{ x: series(analysis.mtfCurves.x), y: series(analysis.mtfCurves.y) }}
            spread={analysis.spread}
            nyquist={analysis.nyquist}
            mtf50={analysis.mtf50}
            mtf10={analysis.mtf10}
            mtfAtNyquist={analysis.mtfAtNyquist}
            widths={{ fwhmMm: analysis.fwhmMm, fwhmXMm: analysis.fwhmXMm, fwhmYMm: analysis.fwhmYMm }}
          />
        </Section>
      </div>

      <Section id="metrics" title="Metrics" description="Against the baseline and tolerances in force for this scanner's test." flush>
        <MetricsTable analysis={analysis} />
      </Section>

      <Section
        id="preview"
        title="Resolution preview"
        description="What bar patterns near the measured MTF50 look like through this result's blur, and through the baseline's."
        flush
      >
        <ResolutionPreviewPanel
          scannerId={scan.scannerId}
          testId={scan.testId}
          lsf={previewSource ? { positionMm: previewSource.positionMm, value: previewSource.value } : null}
          lsfNote={lsfNote}
          mtf50={analysis.mtf50}
        />
      </Section>

      <div className="grid items-start gap-6 xl:grid-cols-2">
        <Section id="warnings" title="Warnings">
          <ScanWarnings warnings={analysis.warnings} driftFlags={analysis.driftFlags} />
        </Section>
        <Section id="details" title="Analysis details">
          <AnalysisDetails view={view} analysis={analysis} />
        </Section>
      </div>

      <Section id="attributes" title="DICOM attributes" description="Header attributes kept with the scan.">
        <DicomAttributes attributes={scan.attributes} />
      </Section>
    </>
  );
}

function Section({ id, title, description, flush = false, children }: { id: string; title: string; description?: string; flush?: boolean; children: ReactNode }) {
  return (
    <Card aria-labelledby={`${id}-title`}>
      <CardHeader>
        <CardTitle id={`${id}-title`}>{title}</CardTitle>
        {description ? <CardDescription>{description}</CardDescription> : null}
      </CardHeader>
      <CardBody flush={flush} className={flush ? "pt-2 pb-4" : undefined}>
        {children}
      </CardBody>
    </Card>
  );
}

const DETAIL_LABELS: Record<string, string> = {
  centreXPx: "Source centre x (px)",
  centreYPx: "Source centre y (px)",
  backgroundLevel: "Background level (image units)",
  noiseSd: "Background noise SD (image units)",
  peakToNoise: "Peak-to-noise ratio",
  fwhmXPx: "FWHM x (px)",
  fwhmYPx: "FWHM y (px)",
  profileBandRows: "Rows averaged per profile",
};

function splitKey(key: string): string {
  const words = key.replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

function AnalysisDetails({ view, analysis }: { view: ScanJsonView; analysis: AnalysisJsonView }) {
  const [rowMm, colMm] = analysis.pixelSpacingMm;
  const fit = analysis.details.gaussianFit as { fwhmMajorMm?: number; fwhmMinorMm?: number; angleDeg?: number } | null | undefined;
  const rows: [string, string][] = [
    ["Method", METHOD_LABELS[analysis.method]],
    ["Pixel spacing (row × column)", `${formatMetric(rowMm, 4)} × ${formatMetric(colMm, 4)} mm`],
    ["Analysed ROI", `x ${analysis.roi.x}, y ${analysis.roi.y}, ${analysis.roi.width} × ${analysis.roi.height} px`],
    ["Nyquist frequency", `${formatMetric(analysis.nyquist, 3)} cycles/mm`],
    ["File", `${view.scan.fileName} (${view.scan.format.toUpperCase()}, ${formatFileSize(view.scan.fileSize)})`],
    ["Analysis software", analysis.version],
    ["Analysed", `${formatScanDateTime(analysis.createdAt)}${analysis.createdBy ? ` by ${analysis.createdBy}` : ""}`],
  ];
  if (analysis.timingMs) rows.push(["Time taken", `decode ${formatMetric(analysis.timingMs.decode, 0)} ms, analysis ${formatMetric(analysis.timingMs.analysis, 0)} ms`]);
  if (fit && typeof fit.fwhmMajorMm === "number" && typeof fit.fwhmMinorMm === "number") {
    // The axis angle means nothing for a round spot: show it only when the axes differ by more than 2 %.
    const elliptical = fit.fwhmMajorMm > 1.02 * fit.fwhmMinorMm && typeof fit.angleDeg === "number";
    rows.push([
      "2-D Gaussian fit FWHM (major × minor)",
      `${formatMetric(fit.fwhmMajorMm, 2)} × ${formatMetric(fit.fwhmMinorMm, 2)} mm${elliptical ? `, major axis at ${formatMetric(fit.angleDeg, 1)}° from x` : ""}`,
    ]);
  }
  for (const [key, value] of Object.entries(analysis.details)) {
    if (typeof value === "number" && Number.isFinite(value)) {
      rows.push([DETAIL_LABELS[key] ?? splitKey(key), Number.isInteger(value) ? String(value) : formatMetric(value, Math.abs(value) >= 100 ? 1 : 3)]);
    }
  }
  if (view.scan.note) rows.push(["Upload note", view.scan.note]);
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-[minmax(0,14rem)_minmax(0,1fr)]">
      {rows.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="pt-0.5 text-caption font-medium text-ink-muted">{label}</dt>
          <dd className="min-w-0 text-body text-ink [overflow-wrap:anywhere]">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
