/**
 * Text for the fleet dashboard and scanner pages: dates, schedule states, metric values and labels.
 * Dates are shown in UTC, the zone the schedule is computed in (lib/qa/schedule.ts), so the server render and the
 * browser agree and "due 8 Dec" means the same day for everyone.
 */
import { formatDate, formatDayMonth, parseIsoDate } from "@/lib/format/dates";
import { METRICS, type MetricKey } from "@/lib/qa/metrics";
import type { Frequency, MethodName, TestStatusJson } from "./qa-types";

export { formatDate, formatDateTime } from "@/lib/format/dates";
const parse = parseIsoDate;

/** "8 Dec" within the current year (UTC), "8 Dec 2027" otherwise. */
export function formatShortDate(iso: string | null | undefined, now = new Date(), fallback = "—"): string {
  const d = parse(iso);
  if (!d) return fallback;
  return d.getUTCFullYear() === now.getUTCFullYear() ? formatDayMonth(d) : formatDate(d.toISOString());
}

/** "YYYY-MM-DD" of a date in UTC (the value of a date input). */
export function isoDay(d: Date): string {
  return d.toISOString().slice(0, 10);
}

export const FREQUENCY_LABELS: Record<Frequency, string> = {
  daily: "Daily",
  weekly: "Weekly",
  monthly: "Monthly",
  quarterly: "Quarterly",
  annual: "Annual",
};

export const METHOD_NAMES: Record<MethodName, string> = {
  point: "Point source",
  line: "Line source",
  edge: "Slanted edge",
  disk: "Disk insert",
};

/** Schedule wording of one test: badge (due/overdue only) and text such as "due 8 Dec", "overdue by 3 days". */
export function dueSummary(test: Pick<TestStatusJson, "due" | "dueAt" | "overdueByDays">, now = new Date()): { badge: "due" | "overdue" | null; text: string } {
  switch (test.due) {
    case "overdue": {
      const days = test.overdueByDays ?? 1;
      return { badge: "overdue", text: `overdue by ${days} ${days === 1 ? "day" : "days"}` };
    }
    case "due":
      return { badge: "due", text: `due ${formatShortDate(test.dueAt, now)}` };
    case "never-tested":
      return { badge: null, text: "never tested" };
    default:
      return { badge: null, text: `next ${formatShortDate(test.dueAt, now)}` };
  }
}

/** Schedule urgency for sorting: overdue (by more days first) < due < never tested < ok (sooner first). */
export function dueRank(test: Pick<TestStatusJson, "due" | "dueAt" | "overdueByDays">): number {
  const at = parse(test.dueAt)?.getTime() ?? 0;
  switch (test.due) {
    case "overdue":
      return -1e6 - (test.overdueByDays ?? 0);
    case "due":
      return at / 1e9; // ~1.8e3: after every overdue, ordered by date
    case "never-tested":
      return 1e5;
    default:
      return 2e5 + at / 1e9;
  }
}

/** "MTF50 (cycles/mm)", "FWHM (mm)", "MTF at Nyquist" — axis and column titles carry the unit. */
export function metricTitle(key: MetricKey): string {
  const m = METRICS[key];
  return m.unit ? `${m.label} (${m.unit})` : m.label;
}

/** A value with the metric's digits, without unit ("0.412"); "—" for null. Uses a true minus sign. */
export function formatValue(key: MetricKey, value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  const text = value.toFixed(METRICS[key].digits);
  return text.startsWith("-") ? `\u2212${text.slice(1)}` : text;
}

/** A value with digits and unit ("0.412 cycles/mm", "1.23 mm"); "—" for null. */
export function formatValueWithUnit(key: MetricKey, value: number | null | undefined): string {
  const text = formatValue(key, value);
  const unit = METRICS[key].unit;
  return text === "—" || !unit ? text : `${text} ${unit}`;
}

/** "higher is worse" / "lower is worse". */
export function directionText(key: MetricKey): string {
  return METRICS[key].direction === "higher-is-worse" ? "higher is worse" : "lower is worse";
}

/** A tolerance level as people read it: "10 %" (relative) or "1.35 mm" (absolute). */
export function formatLevel(key: MetricKey, mode: "relative" | "absolute", level: number): string {
  if (mode === "relative") return `${Number(level.toFixed(2))} %`;
  return formatValueWithUnit(key, level);
}
