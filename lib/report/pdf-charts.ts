/**
 * Small vector-chart renderer for the PDF QA report (pdfkit): a trend chart of one metric against time and an MTF
 * chart (MTF against spatial frequency). Everything is drawn inside a caller-given box in PDF points (1/72 inch),
 * y down; nothing here adds pages. Result status is told by marker SHAPE as well as colour, so charts stay readable
 * in grey-scale print: filled circle = pass, filled triangle = warning, filled square = action, hollow circle = no
 * baseline.
 */
import type { Status } from "@/lib/qa";

type Doc = PDFKit.PDFDocument;

export const CHART_COLORS = {
  ink: "#1f2933",
  muted: "#616e7c",
  axis: "#7b8794",
  grid: "#e4e7eb",
  series: "#1c4e80",
  baseline: "#3e4c59",
  connector: "#bcc5cf",
  warning: "#b7791f",
  action: "#c53030",
  pass: "#2f855a",
  noBaseline: "#616e7c",
  service: "#6b46c1",
} as const;

export const STATUS_COLORS: Readonly<Record<Status, string>> = {
  pass: CHART_COLORS.pass,
  warning: CHART_COLORS.warning,
  action: CHART_COLORS.action,
  "no-baseline": CHART_COLORS.noBaseline,
};

export const STATUS_LABELS: Readonly<Record<Status, string>> = { pass: "pass", warning: "warning", action: "action", "no-baseline": "no baseline" };

/** Dash patterns (on, off in points): warning and action limits differ in pattern as well as colour. */
const DASH = { warning: [3, 2], action: [7, 2.5], service: [1, 1.5], nyquist: [4, 2], baselineCurve: [5, 2.5] } as const;

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

const FONT = "Helvetica";
const FONT_BOLD = "Helvetica-Bold";
const TICK_FONT_SIZE = 6.5;

/** About `maxCount` round tick values (1, 2, 2.5, 5 × 10^k) covering [min, max]. Requires finite min < max. */
export function niceTicks(min: number, max: number, maxCount = 5): { ticks: number[]; step: number } {
  const raw = (max - min) / Math.max(1, maxCount);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = ([1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw - 1e-12 * mag) ?? 10 * mag);
  const ticks: number[] = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return { ticks, step };
}

/** Decimals that show every tick of this step exactly (2.5-type steps need one more). */
function tickDecimals(step: number): number {
  const d = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return Number((step / 10 ** -d).toFixed(6)) % 1 === 0 ? d : d + 1;
}

/** A y domain around the values with 8 % padding, widened to whole tick steps. */
function valueDomain(values: number[]): { min: number; max: number; ticks: number[]; decimals: number } {
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (!(hi > lo)) {
    const half = Math.max(Math.abs(lo) * 0.1, 1e-3);
    lo -= half;
    hi += half;
  } else {
    const pad = (hi - lo) * 0.08;
    lo -= pad;
    hi += pad;
  }
  const { step } = niceTicks(lo, hi, 4);
  const min = Math.floor(lo / step + 1e-9) * step;
  const max = Math.ceil(hi / step - 1e-9) * step;
  return { min, max, ticks: niceTicks(min, max, 4).ticks, decimals: tickDecimals(step) };
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const DAY_MS = 86_400_000;

/** Date ticks for a UTC time axis: whole days (1, 2, 7, 14) or first days of months (1, 2, 3, 6, 12). */
export function timeTicks(from: Date, to: Date, maxCount = 6): { at: Date; label: string; sublabel: string }[] {
  const span = to.getTime() - from.getTime();
  for (const days of [1, 2, 7, 14]) {
    if (span / (days * DAY_MS) > maxCount) continue;
    const out: { at: Date; label: string; sublabel: string }[] = [];
    const start = Math.ceil(from.getTime() / DAY_MS) * DAY_MS;
    for (let t = start; t <= to.getTime(); t += days * DAY_MS) {
      const d = new Date(t);
      const sublabel: string = out.length === 0 || (d.getUTCMonth() === 0 && d.getUTCDate() <= days) ? String(d.getUTCFullYear()) : "";
      out.push({ at: d, label: `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`, sublabel });
    }
    return out;
  }
  for (const months of [1, 2, 3, 6, 12, 24, 60, 120]) {
    if (months < 120 && span / (months * 30.44 * DAY_MS) > maxCount) continue;
    const out: { at: Date; label: string; sublabel: string }[] = [];
    const first = Date.UTC(from.getUTCFullYear(), from.getUTCMonth(), 1);
    for (let k = first < from.getTime() ? 1 : 0; ; k++) {
      const d = new Date(Date.UTC(from.getUTCFullYear(), from.getUTCMonth() + k, 1));
      if (d > to) break;
      const mi = d.getUTCMonth();
      if (months < 12 ? mi % months !== 0 : mi !== 0 || d.getUTCFullYear() % (months / 12) !== 0) continue;
      const sublabel: string = months < 12 && (out.length === 0 || mi === 0) ? String(d.getUTCFullYear()) : "";
      out.push({ at: d, label: months >= 12 ? String(d.getUTCFullYear()) : MONTHS[mi]!, sublabel });
    }
    return out;
  }
  return [];
}

/** One result marker centred at (cx, cy); `r` is the circle radius in points (other shapes are matched in area). */
export function drawStatusMarker(doc: Doc, status: Status, cx: number, cy: number, r = 2.6): void {
  const color = STATUS_COLORS[status];
  doc.save().lineWidth(0.8);
  if (status === "pass") doc.circle(cx, cy, r).fill(color);
  else if (status === "warning") {
    const s = r * 1.45;
    doc.polygon([cx, cy - s], [cx + s * 0.95, cy + s * 0.7], [cx - s * 0.95, cy + s * 0.7]).fill(color);
  } else if (status === "action") {
    const s = r * 0.9;
    doc.rect(cx - s, cy - s, 2 * s, 2 * s).fill(color);
  } else doc.circle(cx, cy, r * 0.9).fillAndStroke("#ffffff", color);
  doc.restore();
}

export type LegendItem =
  | { kind: "marker"; status: Status; label: string }
  | { kind: "line"; color: string; dash?: readonly number[]; width?: number; label: string }
  | { kind: "vline"; color: string; dash?: readonly number[]; label: string };

/** Legend items flowed left to right, wrapping inside `width`; returns the height used. */
export function drawLegend(doc: Doc, items: LegendItem[], x: number, y: number, width: number, fontSize = 6.5): number {
  const rowH = fontSize + 3.5;
  let cx = x;
  let cy = y;
  doc.font(FONT).fontSize(fontSize);
  for (const item of items) {
    const symbolW = item.kind === "marker" ? 7 : item.kind === "vline" ? 5 : 14;
    const w = symbolW + 3 + doc.widthOfString(item.label) + 9;
    if (cx > x && cx + w - 9 > x + width) {
      cx = x;
      cy += rowH;
    }
    const my = cy + fontSize * 0.45;
    if (item.kind === "marker") drawStatusMarker(doc, item.status, cx + 3, my, 2.4);
    else {
      doc.save().lineWidth(item.kind === "line" ? item.width ?? 1 : 0.8).strokeColor(item.color);
      if (item.dash) doc.dash(item.dash[0]!, { space: item.dash[1] });
      if (item.kind === "line") doc.moveTo(cx, my).lineTo(cx + symbolW, my).stroke();
      else doc.moveTo(cx + 2.5, my - fontSize * 0.6).lineTo(cx + 2.5, my + fontSize * 0.6).stroke();
      doc.restore();
    }
    doc.fillColor(CHART_COLORS.ink).text(item.label, cx + symbolW + 3, cy, { lineBreak: false });
    cx += w;
  }
  return cy - y + rowH;
}

/** Height drawLegend would use, without drawing. */
export function legendHeight(doc: Doc, items: LegendItem[], width: number, fontSize = 6.5): number {
  doc.font(FONT).fontSize(fontSize);
  let rows = 1;
  let cx = 0;
  for (const item of items) {
    const symbolW = item.kind === "marker" ? 7 : item.kind === "vline" ? 5 : 14;
    const w = symbolW + 3 + doc.widthOfString(item.label) + 9;
    if (cx > 0 && cx + w - 9 > width) {
      rows += 1;
      cx = 0;
    }
    cx += w;
  }
  return rows * (fontSize + 3.5);
}

interface Plot {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** Title at the top of the box; returns the y below it. */
function drawTitle(doc: Doc, box: Box, title: string): number {
  doc.font(FONT_BOLD).fontSize(8).fillColor(CHART_COLORS.ink).text(title, box.x, box.y, { width: box.width, lineBreak: false, ellipsis: true });
  return box.y + 12;
}

/** Y axis: grid lines, tick labels and the rotated axis label. */
function drawYAxis(doc: Doc, plot: Plot, min: number, max: number, ticks: number[], decimals: number, label: string): void {
  const yOf = (v: number) => plot.top + plot.height - ((v - min) / (max - min)) * plot.height;
  doc.save().lineWidth(0.4).strokeColor(CHART_COLORS.grid);
  for (const t of ticks) doc.moveTo(plot.left, yOf(t)).lineTo(plot.left + plot.width, yOf(t)).stroke();
  doc.restore();
  doc.font(FONT).fontSize(TICK_FONT_SIZE).fillColor(CHART_COLORS.muted);
  for (const t of ticks) {
    const text = t.toFixed(decimals);
    doc.text(text, plot.left - 3 - doc.widthOfString(text), yOf(t) - TICK_FONT_SIZE / 2, { lineBreak: false });
  }
  const w = doc.widthOfString(label);
  const ox = plot.left - 30;
  const oy = plot.top + plot.height / 2;
  doc.save().rotate(-90, { origin: [ox, oy] });
  doc.text(label, ox - w / 2, oy, { lineBreak: false });
  doc.restore();
}

function drawFrame(doc: Doc, plot: Plot): void {
  doc.save().lineWidth(0.6).strokeColor(CHART_COLORS.axis);
  doc.moveTo(plot.left, plot.top).lineTo(plot.left, plot.top + plot.height).lineTo(plot.left + plot.width, plot.top + plot.height).stroke();
  doc.restore();
}

/** A note in the middle of the plot on a white ground, so lines behind it do not run through the words. */
function centredNote(doc: Doc, plot: Plot, text: string): void {
  doc.font(FONT).fontSize(7.5);
  const w = doc.widthOfString(text);
  const x = plot.left + (plot.width - w) / 2;
  const y = plot.top + plot.height / 2 - 4;
  doc.save().rect(x - 4, y - 3, w + 8, 14).fill("#ffffff").restore();
  doc.fillColor(CHART_COLORS.muted).text(text, x, y, { lineBreak: false });
}

function horizontalLine(doc: Doc, plot: Plot, y: number, color: string, width: number, dash?: readonly number[]): void {
  doc.save().lineWidth(width).strokeColor(color);
  if (dash) doc.dash(dash[0]!, { space: dash[1] });
  doc.moveTo(plot.left, y).lineTo(plot.left + plot.width, y).stroke();
  doc.restore();
}

export interface TrendChartSpec {
  box: Box;
  title: string;
  /** Y-axis label with the unit, e.g. "FWHM (mm)". */
  axisLabel: string;
  from: Date;
  to: Date;
  points: { at: Date; value: number | null; status: Status }[];
  baseline: number | null;
  warningLimit: number | null;
  actionLimit: number | null;
  serviceEvents: Date[];
  emptyText: string;
}

/**
 * Trend of one metric over the period: result markers by status joined by a thin line, the baseline (solid), the
 * warning and action limits (dashed) and service events (dotted verticals), with a legend of what is drawn.
 */
export function drawTrendChart(doc: Doc, spec: TrendChartSpec): void {
  const { box } = spec;
  const values = spec.points.filter((p) => p.value !== null) as { at: Date; value: number; status: Status }[];
  const statuses = (["pass", "warning", "action", "no-baseline"] as const).filter((s) => values.some((p) => p.status === s));
  const legend: LegendItem[] = statuses.map((s) => ({ kind: "marker", status: s, label: STATUS_LABELS[s] }));
  if (spec.baseline !== null) legend.push({ kind: "line", color: CHART_COLORS.baseline, width: 0.9, label: "baseline" });
  if (spec.warningLimit !== null) legend.push({ kind: "line", color: CHART_COLORS.warning, dash: DASH.warning, label: "warning limit" });
  if (spec.actionLimit !== null) legend.push({ kind: "line", color: CHART_COLORS.action, dash: DASH.action, label: "action limit" });
  if (spec.serviceEvents.length) legend.push({ kind: "vline", color: CHART_COLORS.service, dash: DASH.service, label: "service" });

  const top = drawTitle(doc, box, spec.title);
  const legendH = legend.length ? legendHeight(doc, legend, box.width - 36) : 0;
  const plot: Plot = { left: box.x + 36, top: top + 4, width: box.width - 40, height: box.y + box.height - legendH - 30 - (top + 4) };
  const t0 = spec.from.getTime();
  const t1 = spec.to.getTime();
  const xOf = (d: Date) => plot.left + ((d.getTime() - t0) / Math.max(1, t1 - t0)) * plot.width;

  const domainValues = values.map((p) => p.value);
  for (const v of [spec.baseline, spec.warningLimit, spec.actionLimit]) if (v !== null && Number.isFinite(v)) domainValues.push(v);
  const dom = domainValues.length ? valueDomain(domainValues) : { min: 0, max: 1, ticks: niceTicks(0, 1, 4).ticks, decimals: 2 };
  const yOf = (v: number) => plot.top + plot.height - ((v - dom.min) / (dom.max - dom.min)) * plot.height;
  drawYAxis(doc, plot, dom.min, dom.max, dom.ticks, dom.decimals, spec.axisLabel);

  // Time ticks under the axis: label, and the year under the first tick and under January.
  doc.font(FONT).fontSize(TICK_FONT_SIZE).fillColor(CHART_COLORS.muted);
  const ticks = timeTicks(spec.from, spec.to, Math.max(2, Math.floor(plot.width / 38)));
  for (const t of ticks) {
    const x = xOf(t.at);
    doc.save().lineWidth(0.5).strokeColor(CHART_COLORS.axis).moveTo(x, plot.top + plot.height).lineTo(x, plot.top + plot.height + 2.5).stroke().restore();
    doc.text(t.label, x - doc.widthOfString(t.label) / 2, plot.top + plot.height + 4, { lineBreak: false });
    if (t.sublabel) doc.text(t.sublabel, x - doc.widthOfString(t.sublabel) / 2, plot.top + plot.height + 11.5, { lineBreak: false });
  }
  const xLabel = "Test date (UTC)";
  doc.text(xLabel, plot.left + plot.width - doc.widthOfString(xLabel), plot.top + plot.height + 19, { lineBreak: false });

  doc.save().rect(plot.left, plot.top - 3, plot.width + 3, plot.height + 6).clip();
  for (const at of spec.serviceEvents) {
    const x = xOf(at);
    doc.save().lineWidth(0.8).strokeColor(CHART_COLORS.service).dash(DASH.service[0], { space: DASH.service[1] });
    doc.moveTo(x, plot.top).lineTo(x, plot.top + plot.height).stroke().restore();
  }
  if (spec.actionLimit !== null) horizontalLine(doc, plot, yOf(spec.actionLimit), CHART_COLORS.action, 0.8, DASH.action);
  if (spec.warningLimit !== null) horizontalLine(doc, plot, yOf(spec.warningLimit), CHART_COLORS.warning, 0.8, DASH.warning);
  if (spec.baseline !== null) horizontalLine(doc, plot, yOf(spec.baseline), CHART_COLORS.baseline, 0.9);
  if (values.length > 1) {
    doc.save().lineWidth(0.5).strokeColor(CHART_COLORS.connector);
    values.forEach((p, i) => (i === 0 ? doc.moveTo(xOf(p.at), yOf(p.value)) : doc.lineTo(xOf(p.at), yOf(p.value))));
    doc.stroke().restore();
  }
  for (const p of values) drawStatusMarker(doc, p.status, xOf(p.at), yOf(p.value));
  doc.restore();
  drawFrame(doc, plot);
  if (values.length === 0) centredNote(doc, plot, spec.emptyText);
  if (legend.length) drawLegend(doc, legend, plot.left, plot.top + plot.height + 30, box.width - 36);
}

export interface MtfChartSpec {
  box: Box;
  title: string;
  curves: { label: string; frequencyCyclesPerMm: number[]; value: number[]; color: string; dashed?: boolean; width?: number }[];
  nyquistCyclesPerMm: number | null;
  /** Shown in the plot: centred when there is no curve, else at the top right (e.g. "No MTF curve in this period"). */
  note: string | null;
}

/**
 * MTF against spatial frequency (cycles/mm) for up to a few curves, with the Nyquist frequency marked. The x axis runs
 * from 0 to 1.2 × Nyquist when known (so the region just past Nyquist shows), else to the end of the longest curve.
 */
export function drawMtfChart(doc: Doc, spec: MtfChartSpec): void {
  const { box } = spec;
  const legend: LegendItem[] = spec.curves.map((c) => ({ kind: "line", color: c.color, dash: c.dashed ? DASH.baselineCurve : undefined, width: c.width ?? 1.2, label: c.label }));
  if (spec.nyquistCyclesPerMm) legend.push({ kind: "vline", color: CHART_COLORS.muted, dash: DASH.nyquist, label: `Nyquist ${spec.nyquistCyclesPerMm.toFixed(3)} cycles/mm` });
  const top = drawTitle(doc, box, spec.title);
  const legendH = legend.length ? legendHeight(doc, legend, box.width - 36) : 0;
  const plot: Plot = { left: box.x + 36, top: top + 4, width: box.width - 44, height: box.y + box.height - legendH - 26 - (top + 4) };

  const curveEnd = Math.max(0, ...spec.curves.map((c) => c.frequencyCyclesPerMm[c.frequencyCyclesPerMm.length - 1] ?? 0));
  const xEnd = spec.nyquistCyclesPerMm ? spec.nyquistCyclesPerMm * 1.2 : curveEnd > 0 ? curveEnd : 1;
  const xt = niceTicks(0, xEnd, Math.max(3, Math.floor(plot.width / 45)));
  const xMax = xt.ticks[xt.ticks.length - 1]! < xEnd - 1e-12 ? xt.ticks[xt.ticks.length - 1]! + xt.step : xt.ticks[xt.ticks.length - 1]!;
  const xTicks = niceTicks(0, xMax, Math.max(3, Math.floor(plot.width / 45))).ticks;
  let yMaxValue = 1;
  for (const c of spec.curves) for (let i = 0; i < c.value.length; i++) if (c.frequencyCyclesPerMm[i]! <= xMax && c.value[i]! > yMaxValue) yMaxValue = c.value[i]!;
  const yt = niceTicks(0, yMaxValue, 5);
  const yMax = yt.ticks[yt.ticks.length - 1]! < yMaxValue - 1e-12 ? yt.ticks[yt.ticks.length - 1]! + yt.step : yt.ticks[yt.ticks.length - 1]!;
  const yTicks = niceTicks(0, yMax, 5);
  const xOf = (f: number) => plot.left + (f / xMax) * plot.width;
  const yOf = (v: number) => plot.top + plot.height - (v / yMax) * plot.height;

  drawYAxis(doc, plot, 0, yMax, yTicks.ticks, tickDecimals(yTicks.step), "MTF");
  const xDecimals = tickDecimals(xt.step);
  doc.font(FONT).fontSize(TICK_FONT_SIZE).fillColor(CHART_COLORS.muted);
  doc.save().lineWidth(0.4).strokeColor(CHART_COLORS.grid);
  for (const f of xTicks) doc.moveTo(xOf(f), plot.top).lineTo(xOf(f), plot.top + plot.height).stroke();
  doc.restore();
  for (const f of xTicks) {
    const text = f.toFixed(xDecimals);
    doc.text(text, xOf(f) - doc.widthOfString(text) / 2, plot.top + plot.height + 4, { lineBreak: false });
  }
  const xLabel = "Spatial frequency (cycles/mm)";
  doc.text(xLabel, plot.left + (plot.width - doc.widthOfString(xLabel)) / 2, plot.top + plot.height + 13, { lineBreak: false });

  doc.save().rect(plot.left, plot.top - 2, plot.width, plot.height + 4).clip();
  if (spec.nyquistCyclesPerMm) {
    const x = xOf(spec.nyquistCyclesPerMm);
    doc.save().lineWidth(0.8).strokeColor(CHART_COLORS.muted).dash(DASH.nyquist[0], { space: DASH.nyquist[1] });
    doc.moveTo(x, plot.top).lineTo(x, plot.top + plot.height).stroke().restore();
  }
  for (const c of spec.curves) {
    doc.save().lineWidth(c.width ?? 1.2).strokeColor(c.color).lineJoin("round");
    if (c.dashed) doc.dash(DASH.baselineCurve[0], { space: DASH.baselineCurve[1] });
    let started = false;
    for (let i = 0; i < c.value.length; i++) {
      const f = c.frequencyCyclesPerMm[i]!;
      if (f > xMax * 1.02) break;
      if (!started) doc.moveTo(xOf(f), yOf(c.value[i]!));
      else doc.lineTo(xOf(f), yOf(c.value[i]!));
      started = true;
    }
    if (started) doc.stroke();
    doc.restore();
  }
  doc.restore();
  if (spec.nyquistCyclesPerMm) {
    const label = "Nyquist";
    doc.font(FONT).fontSize(TICK_FONT_SIZE).fillColor(CHART_COLORS.muted);
    const x = xOf(spec.nyquistCyclesPerMm);
    doc.text(label, Math.min(x + 2, plot.left + plot.width - doc.widthOfString(label)), plot.top + 1, { lineBreak: false });
  }
  drawFrame(doc, plot);
  if (spec.note && spec.curves.length === 0) centredNote(doc, plot, spec.note);
  else if (spec.note) {
    doc.font(FONT).fontSize(7.5);
    const w = doc.widthOfString(spec.note);
    const x = plot.left + plot.width - w - 6;
    doc.save().rect(x - 3, plot.top + 11, w + 6, 12).fill("#ffffff").restore();
    doc.fillColor(CHART_COLORS.muted).text(spec.note, x, plot.top + 13, { lineBreak: false });
  }
  if (legend.length) drawLegend(doc, legend, plot.left, plot.top + plot.height + 25, box.width - 36);
}
