import { z } from "zod";

// Calendar dates as YYYY-MM-DD text, counted in whole days on the proleptic Gregorian calendar
// (UTC day numbers), so no time zone or daylight-saving shift ever moves a due date.

const MS_PER_DAY = 86_400_000;

/** A date as the forms, the API and the database exchange it. */
export const calendarDateSchema = z.iso.date({ error: "give a date as YYYY-MM-DD" });

/** Days since 1970-01-01 for a valid YYYY-MM-DD, or null (2026-02-30 is not a date). */
export function parseCalendarDate(text: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return null;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const ms = Date.UTC(year, month - 1, day);
  const back = new Date(ms);
  if (back.getUTCFullYear() !== year || back.getUTCMonth() !== month - 1 || back.getUTCDate() !== day) return null;
  return ms / MS_PER_DAY;
}

function requireDay(text: string): number {
  const day = parseCalendarDate(text);
  if (day === null) throw new RangeError(`"${text}" is not a calendar date (YYYY-MM-DD)`);
  return day;
}

/** Whole days from `from` to `to`: positive when `to` is later. */
export function countDaysBetween(from: string, to: string): number {
  return requireDay(to) - requireDay(from);
}

export function addDays(date: string, days: number): string {
  return new Date((requireDay(date) + days) * MS_PER_DAY).toISOString().slice(0, 10);
}

/** The calendar day of an instant as the clock of the given offset reads it (minutes east of UTC). */
export function toCalendarDate(instant: Date, offsetMinutes = -instant.getTimezoneOffset()): string {
  return new Date(instant.getTime() + offsetMinutes * 60_000).toISOString().slice(0, 10);
}
