/**
 * Test frequencies and due dates. All calendar arithmetic is in UTC; months are added on the calendar, with the
 * day of month clamped to the target month's length (31 Jan + 1 month = 28 or 29 Feb), the convention of
 * java.time's LocalDate.plusMonths (from memory). Time of day is kept.
 *
 * States, for a test last done validly at `last`, due at `dueAt = last + interval`:
 * - "ok":      now < dueAt − dueSoonFraction·(dueAt − last)   (before the last 20 % of the interval by default);
 * - "due":     from then until dueAt + grace, inclusive — the test should be done now;
 * - "overdue": now > dueAt + grace;
 * - "never-tested": no valid result yet (dueAt and overdueByDays are null).
 * Typical frequencies per modality are in the domain notes §5 (e.g. gamma-camera bar phantom weekly, PET/CT NEMA-type
 * resolution annually and after major service).
 */
import { QaError, assertFinite } from "./qa-error";

export type Frequency = "daily" | "weekly" | "monthly" | "quarterly" | "annual";
export const FREQUENCIES: readonly Frequency[] = ["daily", "weekly", "monthly", "quarterly", "annual"];

export type DueStateName = "ok" | "due" | "overdue" | "never-tested";

export interface DueState {
  state: DueStateName;
  /** last + interval; null when never tested. */
  dueAt: Date | null;
  /** Whole days elapsed since dueAt (rounded down, at least 1) when overdue; null otherwise. */
  overdueByDays: number | null;
}

export interface ScheduleOptions {
  /** Days after dueAt before the test counts as overdue (may be fractional). */
  graceDays?: number;
  /** Fraction of the interval before dueAt during which the test is "due" (0 … 1). */
  dueSoonFraction?: number;
}

const DAY_MS = 86_400_000;

/** Interval of each frequency: a number of days or of calendar months. */
export const FREQUENCY_INTERVALS: Readonly<Record<Frequency, { days: number } | { months: number }>> = {
  daily: { days: 1 },
  weekly: { days: 7 },
  monthly: { months: 1 },
  quarterly: { months: 3 },
  annual: { months: 12 },
};

/**
 * Defaults (Halfmax choices, no published source; set per test): the last 20 % of the interval is "due"; the grace
 * lets a daily test done a little later in the day, or a monthly one a few days late, stay "due" rather than "overdue".
 */
export const SCHEDULE_DEFAULTS: { dueSoonFraction: number; graceDays: Readonly<Record<Frequency, number>> } = {
  dueSoonFraction: 0.2,
  graceDays: { daily: 0.5, weekly: 1, monthly: 3, quarterly: 7, annual: 14 },
};

/** Number of days in a month of the Gregorian calendar (month 0 = January). */
export function daysInMonthUtc(year: number, month: number): number {
  return new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
}

/** `date` plus `months` calendar months in UTC, day clamped to the target month's last day, time of day kept. */
export function addMonthsUtc(date: Date, months: number): Date {
  if (!Number.isInteger(months)) throw new QaError(`months must be an integer, got ${months}`);
  const total = date.getUTCFullYear() * 12 + date.getUTCMonth() + months;
  const year = Math.floor(total / 12);
  const month = total - year * 12;
  const day = Math.min(date.getUTCDate(), daysInMonthUtc(year, month));
  return new Date(
    Date.UTC(year, month, day, date.getUTCHours(), date.getUTCMinutes(), date.getUTCSeconds(), date.getUTCMilliseconds()),
  );
}

function checkFrequency(frequency: Frequency): void {
  if (!Object.prototype.hasOwnProperty.call(FREQUENCY_INTERVALS, frequency)) {
    throw new QaError(`test frequency must be one of ${FREQUENCIES.join(", ")}, got "${String(frequency)}"`);
  }
}

function checkDate(date: Date, what: string): void {
  if (!(date instanceof Date) || Number.isNaN(date.getTime())) throw new QaError(`${what} must be a valid Date, got ${String(date)}`);
}

/** The date one interval of `frequency` after `from` (UTC calendar arithmetic). Throws QaError for bad input. */
export function nextDueAt(from: Date, frequency: Frequency): Date {
  checkDate(from, "start date");
  checkFrequency(frequency);
  const interval = FREQUENCY_INTERVALS[frequency];
  return "days" in interval ? new Date(from.getTime() + interval.days * DAY_MS) : addMonthsUtc(from, interval.months);
}

/**
 * Due state of a test at `now` given its last valid result (see the module comment for the states).
 * Options default to SCHEDULE_DEFAULTS. Throws QaError for an invalid date, frequency, negative grace, or a
 * dueSoonFraction outside [0, 1].
 */
export function dueState(lastValidResultAt: Date | null, frequency: Frequency, now: Date, options: ScheduleOptions = {}): DueState {
  checkFrequency(frequency);
  checkDate(now, "now");
  const graceDays = options.graceDays ?? SCHEDULE_DEFAULTS.graceDays[frequency];
  const fraction = options.dueSoonFraction ?? SCHEDULE_DEFAULTS.dueSoonFraction;
  assertFinite(graceDays, "grace period (days)");
  assertFinite(fraction, "due-soon fraction");
  if (graceDays < 0) throw new QaError(`grace period must be ≥ 0 days, got ${graceDays}`);
  if (fraction < 0 || fraction > 1) throw new QaError(`due-soon fraction must be between 0 and 1, got ${fraction}`);
  if (lastValidResultAt === null) return { state: "never-tested", dueAt: null, overdueByDays: null };
  checkDate(lastValidResultAt, "last valid result date");

  const last = lastValidResultAt.getTime();
  const dueAt = nextDueAt(lastValidResultAt, frequency);
  const due = dueAt.getTime();
  const t = now.getTime();
  if (t > due + graceDays * DAY_MS) {
    return { state: "overdue", dueAt, overdueByDays: Math.max(1, Math.floor((t - due) / DAY_MS)) };
  }
  if (t >= due - fraction * (due - last)) return { state: "due", dueAt, overdueByDays: null };
  return { state: "ok", dueAt, overdueByDays: null };
}
