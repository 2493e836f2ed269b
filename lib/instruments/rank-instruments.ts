import { computeCalibrationStatus, countDaysUntilDue, type CalibrationStatus } from "./calibration-status";

type Rankable = { active: boolean; dueOn: string; identifier: string };
export type Ranked<T extends Rankable> = T & { status: CalibrationStatus; daysLeft: number };

const ORDER: Record<CalibrationStatus, number> = { overdue: 0, "due soon": 1, valid: 2 };

/** Instruments in use first; among them overdue, then due soon, then valid, each soonest due first. */
export function rankInstruments<T extends Rankable>(instruments: readonly T[], today: string): Ranked<T>[] {
  return instruments
    .map((i) => ({ ...i, status: computeCalibrationStatus(i.dueOn, today), daysLeft: countDaysUntilDue(i.dueOn, today) }))
    .sort(
      (a, b) =>
        Number(b.active) - Number(a.active) || ORDER[a.status] - ORDER[b.status] || a.daysLeft - b.daysLeft || a.identifier.localeCompare(b.identifier),
    );
}
