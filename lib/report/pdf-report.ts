/**
 * The periodic spatial-resolution QA report of one scanner as a PDF (pdfkit, A4 portrait, standard Helvetica so no
 * font files or network are needed). Sections: identity and period, summary table, per-test trends and MTF curves,
 * alerts, service events, tolerances, sign-off. Dates are UTC, ISO 8601 (YYYY-MM-DD).
 */
import PDFDocument from "pdfkit";
import { formatMetric, type MetricKey, type Status } from "@/lib/qa";
import { CHART_COLORS, drawMtfChart, drawStatusMarker, drawTrendChart, STATUS_COLORS, type MtfChartSpec } from "./pdf-charts";
import type { ReportData, ReportMetric, ReportTest, ReportTolerance } from "./report-data";

type Doc = PDFKit.PDFDocument;

/** The caution printed above the signatures (domain notes §8). */
export const REPORT_CAUTION =
  "Results support, and never replace, the judgement of the qualified medical physicist. Tolerances follow the " +
  "department's QA programme, the manufacturer's specifications and local regulations.";

const MARGIN = { top: 50, bottom: 58, left: 48, right: 48 };
const FONT = "Helvetica";
const BOLD = "Helvetica-Bold";
const TEXT_SIZE = 8.5;
const SMALL = 7.5;
const MAX_UNSIGNED_ROWS = 25;

const STATUS_TEXT: Readonly<Record<Status, string>> = { pass: "Pass", warning: "Warning", action: "Action", "no-baseline": "No baseline" };
const METHOD_TEXT = { point: "Point source (PSF)", line: "Line source (LSF)", edge: "Slanted edge (ESF)", disk: "Circular edge (ESF)" } as const;
const DUE_TEXT = { ok: "on schedule", due: "due now", overdue: "overdue", "never-tested": "never tested" } as const;

// The standard fonts are WinAnsi-encoded: map the few non-WinAnsi characters our texts use, replace any other.
const WIN_ANSI_EXTRA = new Set([0x152, 0x153, 0x160, 0x161, 0x178, 0x17d, 0x17e, 0x192, 0x2c6, 0x2dc, 0x2013, 0x2014, 0x2018, 0x2019, 0x201a, 0x201c, 0x201d, 0x201e, 0x2020, 0x2021, 0x2022, 0x2026, 0x2030, 0x2039, 0x203a, 0x20ac, 0x2122]);
const REPLACEMENTS: Record<string, string> = { "−": "-", "≥": ">=", "≤": "<=", "≈": "~", "→": "->", "←": "<-", "σ": "sigma", "√": "sqrt", "′": "'", "″": '"', "⁻": "-", "¹": "1", "\u00a0": " " };

/** Text safe for the WinAnsi-encoded standard fonts: known symbols spelled out, anything else outside it as "?". */
export function pdfSafeText(text: string): string {
  let out = "";
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if (REPLACEMENTS[ch] !== undefined && code > 0xff) out += REPLACEMENTS[ch];
    else if (ch === "\n" || (code >= 0x20 && code < 0x7f) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.has(code)) out += ch;
    else if (ch === "\t") out += " ";
    else out += "?";
  }
  return out;
}

const isoDate = (d: Date | null | undefined) => (d ? d.toISOString().slice(0, 10) : "-");
const isoMinute = (d: Date) => `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

interface Flow {
  doc: Doc;
  y: number;
}

const contentWidth = (doc: Doc) => doc.page.width - MARGIN.left - MARGIN.right;
const bottomLimit = (doc: Doc) => doc.page.height - MARGIN.bottom;

function newPage(f: Flow): void {
  f.doc.addPage();
  f.y = MARGIN.top;
}

/** Start a new page unless `height` more points fit on this one. */
function ensureSpace(f: Flow, height: number): void {
  if (f.y + height > bottomLimit(f.doc) && f.y > MARGIN.top) newPage(f);
}

function measure(doc: Doc, text: string, font: string, size: number, width: number): number {
  return doc.font(font).fontSize(size).heightOfString(pdfSafeText(text), { width });
}

function paragraph(f: Flow, text: string, opts: { font?: string; size?: number; color?: string; x?: number; width?: number; gap?: number } = {}): void {
  const { doc } = f;
  const font = opts.font ?? FONT;
  const size = opts.size ?? TEXT_SIZE;
  const x = opts.x ?? MARGIN.left;
  const width = opts.width ?? contentWidth(doc);
  const h = measure(doc, text, font, size, width);
  ensureSpace(f, h);
  doc.font(font).fontSize(size).fillColor(opts.color ?? CHART_COLORS.ink).text(pdfSafeText(text), x, f.y, { width });
  f.y += h + (opts.gap ?? 4);
}

function heading(f: Flow, text: string, level: 1 | 2 = 1): void {
  const size = level === 1 ? 12 : 10;
  ensureSpace(f, size + 80); // keep a heading with the start of what follows it
  f.y += level === 1 ? 8 : 4;
  f.doc.font(BOLD).fontSize(size).fillColor(CHART_COLORS.ink).text(pdfSafeText(text), MARGIN.left, f.y, { width: contentWidth(f.doc) });
  f.y += size + 3;
  if (level === 1) {
    f.doc.save().lineWidth(0.6).strokeColor(CHART_COLORS.grid).moveTo(MARGIN.left, f.y).lineTo(MARGIN.left + contentWidth(f.doc), f.y).stroke().restore();
    f.y += 5;
  }
}

type Cell = string | { text: string; status?: Status; bold?: boolean; color?: string; span?: number };
interface Column {
  header: string;
  width: number;
  align?: "left" | "right";
}

/** Cells of a row placed on the columns: x offset and width of each, a cell with `span` covering several columns. */
function placeCells(columns: Column[], row: Cell[]) {
  const placed: { cell: Exclude<Cell, string>; x: number; width: number; align: "left" | "right" }[] = [];
  let col = 0;
  let x = 0;
  for (const cell of row) {
    if (col >= columns.length) break;
    const c = typeof cell === "string" ? { text: cell } : cell;
    const span = Math.min(Math.max(1, c.span ?? 1), columns.length - col);
    const width = columns.slice(col, col + span).reduce((a, k) => a + k.width, 0);
    placed.push({ cell: c, x, width, align: span === 1 ? columns[col]!.align ?? "left" : "left" });
    col += span;
    x += width;
  }
  return placed;
}

/** A table that breaks across pages, repeating its header; cells wrap, a status cell gets its marker shape. */
function table(f: Flow, columns: Column[], rows: Cell[][], size = SMALL): void {
  const { doc } = f;
  const pad = 3;
  const total = columns.reduce((s, c) => s + c.width, 0);
  const drawHeader = () => {
    const h = Math.max(...columns.map((c) => measure(doc, c.header, BOLD, size, c.width - 2 * pad))) + 2 * pad;
    doc.save().rect(MARGIN.left, f.y, total, h).fill("#f0f2f5").restore();
    let x = MARGIN.left;
    for (const c of columns) {
      doc.font(BOLD).fontSize(size).fillColor(CHART_COLORS.ink).text(pdfSafeText(c.header), x + pad, f.y + pad, { width: c.width - 2 * pad, align: c.align ?? "left" });
      x += c.width;
    }
    f.y += h;
  };
  ensureSpace(f, 40);
  drawHeader();
  for (const row of rows) {
    const placed = placeCells(columns, row);
    const textWidth = (p: (typeof placed)[number]) => p.width - 2 * pad - (p.cell.status ? 9 : 0);
    const h = Math.max(...placed.map((p) => measure(doc, p.cell.text, p.cell.bold ? BOLD : FONT, size, textWidth(p)))) + 2 * pad;
    if (f.y + h > bottomLimit(doc)) {
      newPage(f);
      drawHeader();
    }
    for (const p of placed) {
      const c = p.cell;
      let tx = MARGIN.left + p.x + pad;
      if (c.status) {
        drawStatusMarker(doc, c.status, tx + 3, f.y + pad + size * 0.45, 2.4);
        tx += 9;
      }
      doc.font(c.bold ? BOLD : FONT).fontSize(size).fillColor(c.color ?? (c.status ? STATUS_COLORS[c.status] : CHART_COLORS.ink));
      doc.text(pdfSafeText(c.text), tx, f.y + pad, { width: textWidth(p), align: p.align });
    }
    f.y += h;
    doc.save().lineWidth(0.4).strokeColor(CHART_COLORS.grid).moveTo(MARGIN.left, f.y).lineTo(MARGIN.left + total, f.y).stroke().restore();
  }
  f.y += 6;
}

/** Label/value pairs in `columns` columns (labels small and grey above their values). */
function keyValueGrid(f: Flow, pairs: [string, string][], columns = 3): void {
  const { doc } = f;
  const colW = contentWidth(doc) / columns;
  for (let i = 0; i < pairs.length; i += columns) {
    const row = pairs.slice(i, i + columns);
    const h = Math.max(...row.map(([, v]) => measure(doc, v || "-", FONT, TEXT_SIZE, colW - 10))) + SMALL + 3;
    ensureSpace(f, h);
    row.forEach(([label, value], j) => {
      const x = MARGIN.left + j * colW;
      doc.font(FONT).fontSize(SMALL - 0.5).fillColor(CHART_COLORS.muted).text(pdfSafeText(label.toUpperCase()), x, f.y, { width: colW - 10, characterSpacing: 0.3 });
      doc.font(FONT).fontSize(TEXT_SIZE).fillColor(CHART_COLORS.ink).text(pdfSafeText(value || "-"), x, f.y + SMALL + 1.5, { width: colW - 10 });
    });
    f.y += h + 5;
  }
}

function toleranceText(t: ReportTolerance, metric: MetricKey): string {
  if (t.mode === "relative") return `${t.warning} % / ${t.action} %`;
  return `${formatMetric(metric, t.warning)} / ${formatMetric(metric, t.action)}`;
}

function baselineText(m: ReportMetric): string {
  if (!m.baseline) return "none";
  const { mean, sd, n } = m.baseline;
  const unit = m.unit ? ` ${m.unit}` : "";
  const spread = sd === null ? "" : ` ± ${sd.toFixed(m.digits)}`;
  return `${mean.toFixed(m.digits)}${spread}${unit}\nn = ${n}`;
}

function deviationText(p: number | null): string {
  if (p === null) return "-";
  return `${p > 0 ? "+" : p < 0 ? "-" : ""}${Math.abs(p).toFixed(1)} %`;
}

function summaryTable(f: Flow, data: ReportData): void {
  const columns: Column[] = [
    { header: "Test", width: 92 },
    { header: "Metric", width: 58 },
    { header: "n", width: 22, align: "right" },
    { header: "Latest value", width: 74 },
    { header: "Baseline mean ± SD", width: 92 },
    { header: "Deviation", width: 44, align: "right" },
    { header: "Status", width: 56 },
    { header: "Warning / action", width: contentWidth(f.doc) - 438 },
  ];
  const rows: Cell[][] = [];
  for (const t of data.tests) {
    if (t.metrics.length === 0) {
      const text = t.resultCount ? "No metric values in this period" : "No results in this period";
      rows.push([{ text: t.name, bold: true }, { text, color: CHART_COLORS.muted, span: columns.length - 1 }]);
      continue;
    }
    t.metrics.forEach((m, i) => {
      const latest = m.latest ? `${formatMetric(m.metric, m.latest.value)}\n${isoDate(m.latest.at)}` : "No results in this period";
      rows.push([
        i === 0 ? { text: t.name, bold: true } : "",
        m.label,
        String(m.valueCount),
        latest,
        baselineText(m),
        deviationText(m.deviationPercent),
        m.latest ? { text: STATUS_TEXT[m.latest.status], status: m.latest.status } : "-",
        `${toleranceText(m.tolerance, m.metric)}${m.tolerance.isDefault ? " *" : ""}`,
      ]);
    });
  }
  if (rows.length === 0) {
    paragraph(f, "This scanner has no active QA tests.", { color: CHART_COLORS.muted });
    return;
  }
  table(f, columns, rows);
  const anyDefault = data.tests.some((t) => t.metrics.some((m) => m.tolerance.isDefault));
  if (anyDefault) paragraph(f, "* Halfmax default tolerance (common practice), not set locally. Relative levels are percentages worse than the baseline mean.", { size: SMALL, color: CHART_COLORS.muted });
}

function testSection(f: Flow, data: ReportData, t: ReportTest): void {
  const { doc } = f;
  heading(f, t.name, 2);
  const method = `${METHOD_TEXT[t.method]}${t.phantom ? ` · phantom: ${t.phantom}` : ""} · ${t.schedule.frequency}${t.active ? "" : " · inactive"}`;
  paragraph(f, method, { color: CHART_COLORS.muted, size: SMALL, gap: 3 });
  const counts = (["pass", "warning", "action", "no-baseline"] as const).filter((s) => t.statusCounts[s] > 0).map((s) => `${t.statusCounts[s]} ${STATUS_TEXT[s].toLowerCase()}`);
  const due = t.schedule.state === "never-tested"
    ? "never tested"
    : `last result ${isoDate(t.schedule.lastResultAt)}, next due ${isoDate(t.schedule.dueAt)} (${DUE_TEXT[t.schedule.state]} as of ${isoDate(t.schedule.asOf)})`;
  keyValueGrid(f, [
    ["Results in period", t.resultCount ? `${t.resultCount} (last ${isoDate(t.lastResultAt)})` : "No results in this period"],
    ["Status of results", counts.length ? counts.join(", ") : "-"],
    ["Signed off", t.resultCount ? `${t.signedOff} of ${t.resultCount}` : "-"],
    ["Schedule", due],
    [
      "Baseline in force",
      t.baseline
        ? `set ${isoDate(t.baseline.setAt)} by ${t.baseline.setBy} from ${plural(t.baseline.n, "result")}${t.baseline.setAt > data.period.toEnd ? " (after this period)" : ""}`
        : "none: results are not evaluated against tolerances",
    ],
    ["Baseline reason", t.baseline?.reason ?? "-"],
  ]);

  if (t.metrics.length === 0 && !t.mtf.baseline && !t.mtf.periodMean) {
    if (t.resultCount) paragraph(f, "The results of this test carry no metric values and no MTF curve.", { color: CHART_COLORS.muted });
    return;
  }
  const gap = 14;
  const w = (contentWidth(doc) - gap) / 2;
  const h = 160;
  const services = data.serviceEvents.map((s) => s.performedAt);
  const charts: ((x: number, y: number) => void)[] = t.metrics.map((m) => (x: number, y: number) =>
    drawTrendChart(doc, {
      box: { x, y, width: w, height: h },
      title: pdfSafeText(`${m.label}${m.unit ? ` (${m.unit})` : ""}`),
      axisLabel: m.unit || "MTF (ratio)",
      from: data.period.from,
      to: data.period.toEnd,
      points: m.points,
      baseline: m.baseline?.mean ?? null,
      warningLimit: m.band?.warningLimit ?? null,
      actionLimit: m.band?.actionLimit ?? null,
      serviceEvents: services,
      emptyText: "No results in this period",
    }),
  );
  const curves: MtfChartSpec["curves"] = [];
  if (t.mtf.periodMean) {
    const label = t.mtf.periodMean.curveCount === 1 && t.mtf.latest ? `Result of ${isoDate(t.mtf.latest.at)}` : `Mean of ${t.mtf.periodMean.curveCount} results in period`;
    curves.push({ ...t.mtf.periodMean, label, color: CHART_COLORS.series, width: 1.4 });
  }
  if (t.mtf.baseline) curves.push({ ...t.mtf.baseline, label: t.baseline ? `Baseline (set ${isoDate(t.baseline.setAt)})` : "Baseline", color: CHART_COLORS.baseline, dashed: true, width: 1 });
  charts.push((x, y) =>
    drawMtfChart(doc, {
      box: { x, y, width: w, height: h },
      title: "MTF of the period against the baseline",
      curves,
      nyquistCyclesPerMm: t.mtf.nyquistCyclesPerMm,
      note: t.mtf.periodMean ? null : t.resultCount ? "No MTF curve in this period" : "No results in this period",
    }),
  );
  for (let i = 0; i < charts.length; i += 2) {
    ensureSpace(f, h + 6);
    charts[i]!(MARGIN.left, f.y);
    charts[i + 1]?.(MARGIN.left + w + gap, f.y);
    f.y += h + 10;
  }
  const notes = [t.mtf.periodNote, t.mtf.periodMean && !t.mtf.baseline ? "No baseline MTF curve is stored for this test." : null].filter((n): n is string => !!n);
  for (const n of notes) paragraph(f, n, { size: SMALL, color: CHART_COLORS.muted });
}

function alertsSection(f: Flow, data: ReportData): void {
  heading(f, "Alerts");
  if (data.alerts.length === 0) {
    paragraph(f, "No alerts were open in this period.", { color: CHART_COLORS.muted });
    return;
  }
  const by = (at: Date | null, name: string | null) => (at ? `${isoDate(at)}${name ? `\n${name}` : ""}` : "-");
  table(
    f,
    [
      { header: "Opened", width: 54 },
      { header: "Test", width: 78 },
      { header: "Cause", width: 44 },
      { header: "Summary", width: 155 },
      { header: "State now", width: 48 },
      { header: "Acknowledged", width: 64 },
      { header: "Resolved", width: contentWidth(f.doc) - 443 },
    ],
    data.alerts.map((a) => [
      isoDate(a.openedAt),
      a.testName ?? "-",
      a.cause,
      `${a.summary}${a.occurrences > 1 ? ` (${a.occurrences} results)` : ""}${a.resolutionNote ? `\nResolution: ${a.resolutionNote}` : ""}`,
      { text: a.state, bold: a.state === "open" },
      by(a.acknowledgedAt, a.acknowledgedBy),
      by(a.resolvedAt, a.resolvedBy),
    ]),
  );
}

function serviceSection(f: Flow, data: ReportData): void {
  heading(f, "Service events");
  if (data.serviceEvents.length === 0) {
    paragraph(f, "No service events in this period.", { color: CHART_COLORS.muted });
    return;
  }
  table(
    f,
    [
      { header: "Date", width: 56 },
      { header: "Engineer", width: 90 },
      { header: "Work done", width: 210 },
      { header: "Parts", width: contentWidth(f.doc) - 400 },
      { header: "Alert", width: 44 },
    ],
    data.serviceEvents.map((s) => [isoDate(s.performedAt), s.engineer, s.description, s.parts || "-", s.alertId ? `#${s.alertId}` : "-"]),
  );
}

function tolerancesSection(f: Flow, data: ReportData): void {
  heading(f, "Tolerances applied");
  if (data.tolerances.length === 0) {
    paragraph(f, "No tolerances apply: no metric has results or a baseline in this period.", { color: CHART_COLORS.muted });
    return;
  }
  const defaultSources = [...new Set(data.tolerances.filter((t) => t.tolerance.isDefault).map((t) => t.tolerance.source))];
  table(
    f,
    [
      { header: "Test", width: 110 },
      { header: "Metric", width: 70 },
      { header: "Warning / action", width: 90 },
      { header: "Basis", width: contentWidth(f.doc) - 270 },
    ],
    data.tolerances.map((t) => [
      t.testName,
      t.label,
      `${toleranceText(t.tolerance, t.metric)} (${t.tolerance.mode})`,
      t.tolerance.isDefault
        ? { text: `Halfmax default, common practice, not set locally [${defaultSources.indexOf(t.tolerance.source) + 1}]`, color: CHART_COLORS.warning }
        : `Set locally: ${t.tolerance.source}`,
    ]),
  );
  defaultSources.forEach((s, i) => paragraph(f, `[${i + 1}] ${s}`, { size: SMALL, color: CHART_COLORS.muted, gap: 2 }));
}

function signOffSection(f: Flow, data: ReportData): void {
  const { doc } = f;
  // Keep the section on one page when it fits there: heading, counts, the unsigned table, caution and signatures.
  const estimate = 320 + Math.min(data.signOff.notSignedOff.length, MAX_UNSIGNED_ROWS) * 16;
  if (estimate < bottomLimit(doc) - MARGIN.top) ensureSpace(f, estimate);
  heading(f, "Review and sign-off");
  const s = data.signOff;
  paragraph(
    f,
    s.results === 0
      ? "No results in this period, so none needed signing off."
      : `${s.signedOff} of ${plural(s.results, "result")} in this period signed off in Halfmax${s.signers.length ? ` (by ${s.signers.join(", ")})` : ""}.`,
  );
  if (s.notSignedOff.length) {
    paragraph(f, "Results not yet signed off:", { font: BOLD, size: SMALL, gap: 2 });
    table(
      f,
      [{ header: "Test date", width: 70 }, { header: "Test", width: 180 }, { header: "Status", width: 80 }, { header: "Scan", width: 60 }],
      s.notSignedOff.slice(0, MAX_UNSIGNED_ROWS).map((r) => [isoDate(r.at), r.testName, { text: STATUS_TEXT[r.status], status: r.status }, `#${r.scanId}`]),
    );
    if (s.notSignedOff.length > MAX_UNSIGNED_ROWS) paragraph(f, `... and ${s.notSignedOff.length - MAX_UNSIGNED_ROWS} more.`, { size: SMALL, color: CHART_COLORS.muted });
  }

  const defaults = data.tolerances.filter((t) => t.tolerance.isDefault);
  const defaultNote = defaults.length === 0
    ? "All tolerances in this report were set locally."
    : `${defaults.length} of ${data.tolerances.length} tolerances in this report are Halfmax defaults ("common practice") rather than ` +
      `locally set: ${[...new Set(defaults.map((d) => `${d.testName}: ${d.label}`))].join("; ")}. They should be reviewed and set by the department.`;
  const width = contentWidth(doc);
  const boxH = measure(doc, REPORT_CAUTION, BOLD, TEXT_SIZE, width - 20) + measure(doc, defaultNote, FONT, SMALL, width - 20) + 22;
  const signH = 96;
  ensureSpace(f, boxH + signH + 16);
  f.y += 4;
  doc.save().rect(MARGIN.left, f.y, width, boxH).fillAndStroke("#f7f8fa", CHART_COLORS.grid).restore();
  let y = f.y + 8;
  doc.font(BOLD).fontSize(TEXT_SIZE).fillColor(CHART_COLORS.ink).text(pdfSafeText(REPORT_CAUTION), MARGIN.left + 10, y, { width: width - 20 });
  y += measure(doc, REPORT_CAUTION, BOLD, TEXT_SIZE, width - 20) + 5;
  doc.font(FONT).fontSize(SMALL).fillColor(CHART_COLORS.muted).text(pdfSafeText(defaultNote), MARGIN.left + 10, y, { width: width - 20 });
  f.y += boxH + 14;

  const colW = (width - 24) / 2;
  const blocks: [string, string][] = [
    ["Medical physicist", data.scanner.responsiblePhysicist ?? ""],
    ["Department lead", ""],
  ];
  blocks.forEach(([role, name], i) => {
    const x = MARGIN.left + i * (colW + 24);
    let by = f.y;
    doc.font(BOLD).fontSize(TEXT_SIZE).fillColor(CHART_COLORS.ink).text(role, x, by, { lineBreak: false });
    by += 16;
    for (const label of ["Name", "Signature", "Date"]) {
      doc.font(FONT).fontSize(SMALL).fillColor(CHART_COLORS.muted).text(label, x, by + 10, { lineBreak: false });
      doc.save().lineWidth(0.6).strokeColor(CHART_COLORS.axis).moveTo(x + 48, by + 18).lineTo(x + colW, by + 18).stroke().restore();
      if (label === "Name" && name) doc.font(FONT).fontSize(TEXT_SIZE).fillColor(CHART_COLORS.ink).text(pdfSafeText(name), x + 50, by + 8, { width: colW - 52, lineBreak: false, ellipsis: true });
      by += 24;
    }
  });
  f.y += signH;
}

function identityBlock(f: Flow, data: ReportData): void {
  const { doc } = f;
  const s = data.scanner;
  doc.font(BOLD).fontSize(18).fillColor(CHART_COLORS.ink).text("Spatial-resolution QA report", MARGIN.left, f.y, { lineBreak: false });
  f.y += 26;
  doc.font(BOLD).fontSize(13).fillColor(CHART_COLORS.series).text(pdfSafeText(s.name), MARGIN.left, f.y, { width: contentWidth(doc) });
  f.y += measure(doc, s.name, BOLD, 13, contentWidth(doc)) + 2;
  const period = `${isoDate(data.period.from)} to ${isoDate(data.period.to)} (UTC, both days included)${data.period.isDefault ? ", default: the last 12 months" : ""}`;
  paragraph(f, period, { size: 9.5, gap: 8 });
  keyValueGrid(f, [
    ["Site", s.siteCity ? `${s.siteName}, ${s.siteCity}` : s.siteName],
    ["Location", s.location],
    ["Modality", s.modality],
    ["Manufacturer", s.manufacturer],
    ["Model", s.model],
    ["Serial number", s.serialNumber],
    ["Responsible physicist", s.responsiblePhysicist ?? "not assigned"],
    ["Service engineers", s.engineers.join(", ") || "none assigned"],
    ["Scanner status", s.active ? "in service" : "retired"],
  ]);
  const versions = data.analysisVersionsInPeriod.length ? data.analysisVersionsInPeriod.join(", ") : "none (no results)";
  paragraph(f, `Generated ${isoMinute(data.generatedAt)} by Halfmax ${data.appVersion} (analysis ${data.analysisVersion}). Analysis versions of the results in this period: ${versions}.`, { size: SMALL, color: CHART_COLORS.muted, gap: 6 });
}

function overview(f: Flow, data: ReportData): void {
  const n = data.signOff.results;
  const counts = { pass: 0, warning: 0, action: 0, "no-baseline": 0 };
  for (const t of data.tests) for (const k of Object.keys(counts) as Status[]) counts[k] += t.statusCounts[k];
  const stillOpen = data.alerts.filter((a) => a.state !== "resolved").length;
  const text = n === 0
    ? `No results in this period. ${plural(data.tests.length, "active test")}; ${plural(data.alerts.length, "alert")} and ${plural(data.serviceEvents.length, "service event")} in the period.`
    : `${plural(n, "result")} from ${plural(data.tests.filter((t) => t.resultCount > 0).length, "test")}: ${counts.pass} pass, ${counts.warning} warning, ${counts.action} action, ` +
      `${counts["no-baseline"]} without baseline. ${plural(data.alerts.length, "alert")} in the period (${stillOpen} not resolved), ` +
      `${plural(data.serviceEvents.length, "service event")}, ${data.signOff.signedOff} of ${n} results signed off.`;
  paragraph(f, text, { gap: 6 });
}

function drawFooters(doc: Doc, data: ReportData): void {
  const range = doc.bufferedPageRange();
  const left = pdfSafeText(`${data.scanner.name} · ${data.scanner.siteName} · QA report ${isoDate(data.period.from)} to ${isoDate(data.period.to)} · Halfmax ${data.appVersion}`);
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0; // writing inside the bottom margin must not start a new page
    const y = doc.page.height - MARGIN.bottom + 22;
    const width = contentWidth(doc);
    doc.save().lineWidth(0.5).strokeColor(CHART_COLORS.grid).moveTo(MARGIN.left, y - 6).lineTo(MARGIN.left + width, y - 6).stroke().restore();
    const pageText = `Page ${i - range.start + 1} of ${range.count}`;
    doc.font(FONT).fontSize(7).fillColor(CHART_COLORS.muted);
    const pageW = doc.widthOfString(pageText);
    doc.text(left, MARGIN.left, y, { width: width - pageW - 12, lineBreak: false, ellipsis: true });
    doc.text(pageText, MARGIN.left + width - pageW, y, { lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}

/** Render the report (see getReportData) to a PDF file's bytes. */
export function renderQaReportPdf(data: ReportData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    layout: "portrait",
    margins: MARGIN,
    bufferPages: true,
    info: {
      Title: pdfSafeText(`Spatial-resolution QA report: ${data.scanner.name}`),
      Author: "Halfmax",
      Subject: `QA report ${isoDate(data.period.from)} to ${isoDate(data.period.to)}`,
      Creator: `Halfmax ${data.appVersion}`,
    },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  const f: Flow = { doc, y: MARGIN.top };
  identityBlock(f, data);
  heading(f, "Summary");
  overview(f, data);
  summaryTable(f, data);
  if (data.tests.length) {
    heading(f, "Trends and MTF by test");
    paragraph(
      f,
      "Markers show each result's status by shape: filled circle pass, triangle warning, square action, hollow circle no baseline. " +
        "Solid line: baseline mean; dashed lines: warning and action limits; dotted verticals: service events.",
      { size: SMALL, color: CHART_COLORS.muted },
    );
    for (const t of data.tests) testSection(f, data, t);
  }
  alertsSection(f, data);
  serviceSection(f, data);
  tolerancesSection(f, data);
  signOffSection(f, data);
  drawFooters(doc, data);
  doc.end();
  return done;
}
