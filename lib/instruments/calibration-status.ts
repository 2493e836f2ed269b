import { countDaysBetween } from "./calendar-date";

export type CalibrationStatus = "valid" | "due soon" | "overdue";

/** An instrument is flagged this many days ahead of its due date, so recalibration can be booked. */
export const DUE_SOON_DAYS = 30;

/** Days left until the calibration falls due: 0 on the due date itself, negative once it has passed. */
export function countDaysUntilDue(dueOn: string, today: string): number {
  return countDaysBetween(today, dueOn);
}

/**
 * Where a calibration stands on `today` (both YYYY-MM-DD; the caller reads the clock). The due date is
 * the last day the calibration covers: usable on it, overdue the day after.
 */
export function computeCalibrationStatus(dueOn: string, today: string): CalibrationStatus {
  const days = countDaysUntilDue(dueOn, today);
  if (days < 0) return "overdue";
  if (days <= DUE_SOON_DAYS) return "due soon";
  return "valid";
}
