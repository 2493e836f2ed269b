import type { CalibrationStatus } from "@/lib/instruments/calibration-status";
import { assertNever } from "@/protocols";

/** The calibration of an instrument in words, from its status and days left (computed on the server). */
export function describeCalibration(i: { status: CalibrationStatus; daysLeft: number; dueOn: string }): string {
  const days = (n: number) => `${n} ${n === 1 ? "day" : "days"}`;
  switch (i.status) {
    case "valid":
      return `calibrated, due on ${i.dueOn}`;
    case "due soon":
      return `calibration due soon: on ${i.dueOn}, in ${days(i.daysLeft)}`;
    case "overdue":
      return `overdue for calibration since ${i.dueOn} (${days(-i.daysLeft)} ago): a run cannot start on it`;
    default:
      return assertNever(i.status);
  }
}
