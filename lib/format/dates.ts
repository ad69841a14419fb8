/**
 * Dates as people read them in Halfmax. Shown in UTC everywhere — the zone schedules are computed in
 * (lib/qa/schedule.ts) — so the server render and every browser agree, and "due 8 Dec" is the same day for all sites.
 */
const DAY_MONTH = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", timeZone: "UTC" });
const DATE = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const DATE_TIME = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone: "UTC" });

export function parseIsoDate(iso: string | null | undefined): Date | null {
  if (!iso) return null;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** "8 Dec 2026", or `fallback`. */
export function formatDate(iso: string | null | undefined, fallback = "—"): string {
  const d = parseIsoDate(iso);
  return d ? DATE.format(d) : fallback;
}

/** "8 Dec 2026, 14:05 UTC", or `fallback`. */
export function formatDateTime(iso: string | null | undefined, fallback = "—"): string {
  const d = parseIsoDate(iso);
  return d ? `${DATE_TIME.format(d)} UTC` : fallback;
}

/** "8 Dec" (UTC). */
export function formatDayMonth(d: Date): string {
  return DAY_MONTH.format(d);
}

/** Value for `<input type="datetime-local">`: the browser's local wall time "YYYY-MM-DDTHH:MM" (the input has no zone). */
export function toDateTimeLocal(d: Date): string {
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A datetime-local value read as the browser's local time, or null when it is not a date. */
export function fromDateTimeLocal(value: string): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value.trim());
  if (!m) return null;
  const d = new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]), Number(m[6] ?? 0));
  return Number.isNaN(d.getTime()) ? null : d;
}
