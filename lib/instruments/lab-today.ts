import "server-only";
import { toCalendarDate } from "./calendar-date";

/**
 * Today's date in the lab, the one place that reads the clock for calendar checks: the server's
 * calendar day, so run the server with TZ set to the lab's time zone.
 */
export function readLabToday(now: Date = new Date()): string {
  return toCalendarDate(now);
}
