import { describe, expect, it } from "vitest";
import { calibrationReminderKey, latestDueDateToRemind, pickCalibrationReminders } from "@/lib/mail/calibration-due";

const TODAY = "2026-12-02";
const at = (id: string, dueOn: string) => ({ id, name: `channel ${id}`, dueOn });

describe("pickCalibrationReminders", () => {
  it("takes instruments due within 30 days, both ends included, and overdue ones; soonest first", () => {
    const picked = pickCalibrationReminders(
      [at("far", "2027-01-02"), at("edge", "2027-01-01"), at("today", "2026-12-02"), at("late", "2026-11-30"), at("soon", "2026-12-12")],
      TODAY,
    );
    expect(picked.map((r) => [r.instrumentId, r.daysLeft])).toEqual([
      ["late", -2],
      ["today", 0],
      ["soon", 10],
      ["edge", 30],
    ]);
  });

  it("counts calendar days across a month end, a leap day and a year end", () => {
    expect(pickCalibrationReminders([at("a", "2028-03-01")], "2028-02-28")[0]?.daysLeft).toBe(2);
    expect(pickCalibrationReminders([at("b", "2027-03-01")], "2027-02-28")[0]?.daysLeft).toBe(1);
    expect(pickCalibrationReminders([at("c", "2027-01-01")], "2026-12-31")[0]?.daysLeft).toBe(1);
  });

  it("keys each reminder by instrument and due date, so a new due date earns a new reminder", () => {
    const [first] = pickCalibrationReminders([at("x", "2026-12-20")], TODAY);
    const [renewed] = pickCalibrationReminders([at("x", "2027-12-20")], "2027-12-01");
    expect(first?.onceKey).toBe("calibration-due:x:2026-12-20");
    expect(renewed?.onceKey).toBe(calibrationReminderKey("x", "2027-12-20"));
    expect(renewed?.onceKey).not.toBe(first?.onceKey);
  });

  it("refuses a due date that is not a calendar date", () => {
    expect(() => pickCalibrationReminders([at("bad", "2026-02-30")], TODAY)).toThrow(RangeError);
  });
});

describe("latestDueDateToRemind", () => {
  it("is 30 days on", () => {
    expect(latestDueDateToRemind(TODAY)).toBe("2027-01-01");
    expect(latestDueDateToRemind("2028-02-15", 30)).toBe("2028-03-16");
  });
});
