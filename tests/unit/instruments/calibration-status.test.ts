import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addDays, countDaysBetween, parseCalendarDate, toCalendarDate } from "@/lib/instruments/calendar-date";
import { computeCalibrationStatus, countDaysUntilDue, DUE_SOON_DAYS } from "@/lib/instruments/calibration-status";
import { rankInstruments } from "@/lib/instruments/rank-instruments";

describe("computeCalibrationStatus", () => {
  const today = "2026-12-01";
  it.each([
    ["2027-06-01", "valid"],
    ["2027-01-01", "valid"], // 31 days ahead
    ["2026-12-31", "due soon"], // exactly 30 days ahead
    ["2026-12-02", "due soon"],
    ["2026-12-01", "due soon"], // the due date is the last day covered
    ["2026-11-30", "overdue"],
    ["2025-12-01", "overdue"],
  ] as const)("due on %s, read on 2026-12-01: %s", (dueOn, status) => {
    expect(computeCalibrationStatus(dueOn, today)).toBe(status);
  });

  it("counts whole calendar days across month, year and leap-day boundaries", () => {
    expect(countDaysUntilDue("2027-01-01", "2026-12-01")).toBe(31);
    expect(countDaysUntilDue("2028-03-01", "2028-02-28")).toBe(2); // 2028 is a leap year
    expect(countDaysUntilDue("2027-03-01", "2027-02-28")).toBe(1);
    expect(countDaysUntilDue("2026-11-30", "2026-12-01")).toBe(-1);
  });

  it("says overdue exactly when the due date is behind today, and due soon only within 30 days", () => {
    const day = fc.integer({ min: 0, max: 40_000 }).map((n) => addDays("1990-01-01", n));
    fc.assert(
      fc.property(day, fc.integer({ min: -400, max: 400 }), (today, offset) => {
        const status = computeCalibrationStatus(addDays(today, offset), today);
        expect(status).toBe(offset < 0 ? "overdue" : offset <= DUE_SOON_DAYS ? "due soon" : "valid");
      }),
    );
  });

  it("refuses text that is not a calendar date instead of guessing", () => {
    expect(() => computeCalibrationStatus("2026-02-30", today)).toThrow(/not a calendar date/);
    expect(() => computeCalibrationStatus("01/12/2026", today)).toThrow(/not a calendar date/);
    expect(() => computeCalibrationStatus("2026-12-31", "")).toThrow(/not a calendar date/);
  });
});

describe("calendar dates", () => {
  it("parses only real dates", () => {
    expect(parseCalendarDate("2024-02-29")).toBe(19_782);
    expect(parseCalendarDate("2023-02-29")).toBeNull();
    expect(parseCalendarDate("2026-13-01")).toBeNull();
    expect(parseCalendarDate("2026-1-01")).toBeNull();
  });

  it("adds days and counts them back", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 40_000 }), fc.integer({ min: -1000, max: 1000 }), (n, k) => {
        const from = addDays("1990-01-01", n);
        expect(countDaysBetween(from, addDays(from, k))).toBe(k);
      }),
    );
  });

  it("reads an instant's calendar day at the given offset from UTC", () => {
    const instant = new Date("2026-12-01T23:30:00Z");
    expect(toCalendarDate(instant, 0)).toBe("2026-12-01");
    expect(toCalendarDate(instant, 60)).toBe("2026-12-02"); // UTC+1: already past midnight
    expect(toCalendarDate(instant, -300)).toBe("2026-12-01");
  });
});

describe("rankInstruments", () => {
  it("puts instruments in use first, overdue then due soon then valid, soonest due first", () => {
    const ranked = rankInstruments(
      [
        { identifier: "valid-later", dueOn: "2027-06-01", active: true },
        { identifier: "out-of-use-overdue", dueOn: "2026-01-01", active: false },
        { identifier: "due-soon", dueOn: "2026-12-20", active: true },
        { identifier: "valid-sooner", dueOn: "2027-02-01", active: true },
        { identifier: "overdue", dueOn: "2026-11-01", active: true },
        { identifier: "due-today", dueOn: "2026-12-01", active: true },
      ],
      "2026-12-01",
    );
    expect(ranked.map((i) => [i.identifier, i.status, i.daysLeft])).toEqual([
      ["overdue", "overdue", -30],
      ["due-today", "due soon", 0],
      ["due-soon", "due soon", 19],
      ["valid-sooner", "valid", 62],
      ["valid-later", "valid", 182],
      ["out-of-use-overdue", "overdue", -334],
    ]);
  });
});
