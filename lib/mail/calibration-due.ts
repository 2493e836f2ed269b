import { addDays } from "@/lib/instruments/calendar-date";
import { countDaysUntilDue, DUE_SOON_DAYS } from "@/lib/instruments/calibration-status";

// Which instruments the admins are reminded of, on which calendar day: pure date arithmetic on
// YYYY-MM-DD text (lib/instruments/calendar-date.ts), no clock and no database.

export interface InstrumentDueDate {
  id: string;
  /** As people name it: "cycler channel CY1-CH02". */
  name: string;
  /** YYYY-MM-DD: the last day the calibration covers. */
  dueOn: string;
}

export interface CalibrationReminder {
  instrumentId: string;
  instrument: string;
  dueOn: string;
  /** 0 on the due date, negative once it has passed. */
  daysLeft: number;
  /** One reminder per instrument and due date: a new calibration (new due date) earns a new one. */
  onceKey: string;
}

export function calibrationReminderKey(instrumentId: string, dueOn: string): string {
  return `calibration-due:${instrumentId}:${dueOn}`;
}

/** The last due date that is already worth a reminder on `today`. */
export function latestDueDateToRemind(today: string, withinDays: number = DUE_SOON_DAYS): string {
  return addDays(today, withinDays);
}

/**
 * Instruments due within `withinDays` of `today` (both ends counted: due today or in exactly 30 days
 * is in) or already overdue, soonest first.
 */
export function pickCalibrationReminders(instruments: readonly InstrumentDueDate[], today: string, withinDays: number = DUE_SOON_DAYS): CalibrationReminder[] {
  return instruments
    .map((i) => ({ instrumentId: i.id, instrument: i.name, dueOn: i.dueOn, daysLeft: countDaysUntilDue(i.dueOn, today), onceKey: calibrationReminderKey(i.id, i.dueOn) }))
    .filter((r) => r.daysLeft <= withinDays)
    .sort((a, b) => a.daysLeft - b.daysLeft || a.instrument.localeCompare(b.instrument));
}
