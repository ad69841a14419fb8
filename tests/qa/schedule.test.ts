import { describe, expect, it } from "vitest";
import { addMonthsUtc, daysInMonthUtc, dueState, nextDueAt } from "@/lib/qa/schedule";
import { QaError } from "@/lib/qa/qa-error";

const utc = (iso: string) => new Date(iso);
const DAY = 86_400_000;

// Gregorian leap-year rule (papal bull Inter gravissimas, 1582; ISO 8601 calendar): divisible by 4, except
// centuries not divisible by 400. Written out here independently of the code under test.
const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

describe("calendar arithmetic", () => {
  it("daysInMonthUtc(year, month) follows the Gregorian rule for 1896–2104", () => {
    for (let y = 1896; y <= 2104; y++) {
      for (let m = 0; m < 12; m++) {
        expect(daysInMonthUtc(y, m), `${y}-${m + 1}`).toBe(m === 1 && isLeap(y) ? 29 : MONTH_DAYS[m]);
      }
    }
  });

  it("addMonthsUtc(31 Jan, 1) clamps to the end of February in leap and common years", () => {
    // Month-end clamping convention (java.time LocalDate.plusMonths, from memory) with the Gregorian leap rule.
    expect(addMonthsUtc(utc("2024-01-31T09:15:00Z"), 1).toISOString()).toBe("2024-02-29T09:15:00.000Z"); // 2024 leap
    expect(addMonthsUtc(utc("2023-01-31T09:15:00Z"), 1).toISOString()).toBe("2023-02-28T09:15:00.000Z");
    expect(addMonthsUtc(utc("2100-01-31T00:00:00Z"), 1).toISOString()).toBe("2100-02-28T00:00:00.000Z"); // century, not leap
    expect(addMonthsUtc(utc("2000-01-31T00:00:00Z"), 1).toISOString()).toBe("2000-02-29T00:00:00.000Z"); // divisible by 400
  });

  it("addMonthsUtc handles other month ends, year roll-over and negative steps", () => {
    expect(addMonthsUtc(utc("2024-02-29T12:00:00Z"), 12).toISOString()).toBe("2025-02-28T12:00:00.000Z");
    expect(addMonthsUtc(utc("2024-02-29T12:00:00Z"), 48).toISOString()).toBe("2028-02-29T12:00:00.000Z");
    expect(addMonthsUtc(utc("2023-11-30T00:00:00Z"), 3).toISOString()).toBe("2024-02-29T00:00:00.000Z");
    expect(addMonthsUtc(utc("2023-10-31T00:00:00Z"), 3).toISOString()).toBe("2024-01-31T00:00:00.000Z");
    expect(addMonthsUtc(utc("2024-03-31T00:00:00Z"), 1).toISOString()).toBe("2024-04-30T00:00:00.000Z");
    expect(addMonthsUtc(utc("2023-12-31T23:59:59.999Z"), 1).toISOString()).toBe("2024-01-31T23:59:59.999Z");
    expect(addMonthsUtc(utc("2024-03-31T00:00:00Z"), -1).toISOString()).toBe("2024-02-29T00:00:00.000Z");
  });

  it("nextDueAt(daily) is exactly 24 h in UTC even across a European DST change", () => {
    // UTC has no daylight-saving time; 31 Mar 2024 is a 23-hour day in Central Europe, not in UTC.
    const from = utc("2024-03-30T23:30:00Z");
    expect(nextDueAt(from, "daily").getTime() - from.getTime()).toBe(DAY);
    expect(nextDueAt(from, "weekly").getTime() - from.getTime()).toBe(7 * DAY);
    expect(nextDueAt(utc("2024-01-31T08:00:00Z"), "monthly").toISOString()).toBe("2024-02-29T08:00:00.000Z");
    expect(nextDueAt(utc("2024-02-29T08:00:00Z"), "annual").toISOString()).toBe("2025-02-28T08:00:00.000Z");
  });
});

describe("dueState", () => {
  it("dueState(weekly) moves ok → due (last 20 % of the interval) → due (grace) → overdue", () => {
    // Definition in schedule.ts; times by hand: last 1 Mar 08:00, due 8 Mar 08:00; 20 % of 7 d = 1.4 d = 33.6 h,
    // so "due" from 6 Mar 22:24; grace 1 d, so "overdue" after 9 Mar 08:00.
    const last = utc("2024-03-01T08:00:00Z");
    const at = (iso: string) => dueState(last, "weekly", utc(iso), { graceDays: 1 });
    expect(at("2024-03-06T22:23:59.999Z")).toEqual({ state: "ok", dueAt: utc("2024-03-08T08:00:00Z"), overdueByDays: null });
    expect(at("2024-03-06T22:24:00Z").state).toBe("due");
    expect(at("2024-03-08T08:00:00Z").state).toBe("due");
    expect(at("2024-03-09T08:00:00Z").state).toBe("due"); // end of grace, inclusive
    expect(at("2024-03-09T08:00:00.001Z")).toEqual({ state: "overdue", dueAt: utc("2024-03-08T08:00:00Z"), overdueByDays: 1 });
    expect(at("2024-03-11T20:00:00Z").overdueByDays).toBe(3); // 3.5 days past the due date, rounded down
  });

  it("dueState(monthly) from 31 Jan in a leap year is due on 29 Feb and overdue on 1 Mar without grace", () => {
    const last = utc("2024-01-31T10:00:00Z");
    expect(dueState(last, "monthly", utc("2024-02-29T09:00:00Z"), { graceDays: 0 }).state).toBe("due");
    const r = dueState(last, "monthly", utc("2024-03-01T10:00:00Z"), { graceDays: 0 });
    expect(r).toEqual({ state: "overdue", dueAt: utc("2024-02-29T10:00:00Z"), overdueByDays: 1 });
    // Common year: due 28 Feb 2023 10:00, so 1 Mar 10:00 is one day overdue too.
    expect(dueState(utc("2023-01-31T10:00:00Z"), "monthly", utc("2023-03-01T10:00:00Z"), { graceDays: 0 }).dueAt).toEqual(
      utc("2023-02-28T10:00:00Z"),
    );
  });

  it("dueState(annual) uses the default 14-day grace and 20 % due window", () => {
    const last = utc("2023-06-15T00:00:00Z");
    expect(dueState(last, "annual", utc("2024-06-20T00:00:00Z")).state).toBe("due");
    expect(dueState(last, "annual", utc("2024-06-29T00:00:01Z")).state).toBe("overdue");
    expect(dueState(last, "annual", utc("2024-01-01T00:00:00Z")).state).toBe("ok");
    // 20 % of 366 days (the interval contains 29 Feb 2024) = 73 d 4 h 48 min before 15 Jun 2024 00:00 → 2 Apr 2024 19:12.
    expect(dueState(last, "annual", utc("2024-04-02T19:11:59Z")).state).toBe("ok");
    expect(dueState(last, "annual", utc("2024-04-02T19:12:00Z")).state).toBe("due");
  });

  it("dueState(null, …) is never-tested", () => {
    expect(dueState(null, "daily", utc("2024-01-01T00:00:00Z"))).toEqual({ state: "never-tested", dueAt: null, overdueByDays: null });
  });

  it("dueState throws QaError for an unknown frequency, negative grace or a bad fraction", () => {
    const now = utc("2024-01-01T00:00:00Z");
    expect(() => dueState(now, "hourly" as never, now)).toThrow(QaError);
    expect(() => dueState(now, "daily", now, { graceDays: -1 })).toThrow(/≥ 0 days/);
    expect(() => dueState(now, "daily", now, { dueSoonFraction: 1.5 })).toThrow(/between 0 and 1/);
    expect(() => dueState(new Date("nope"), "daily", now)).toThrow(/valid Date/);
  });
});
