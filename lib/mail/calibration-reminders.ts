import "server-only";
import { getDb } from "@/db";
import { listInstruments } from "@/db/instruments";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/instrument-kind";
import { readLabToday } from "@/lib/instruments/lab-today";
import { pickCalibrationReminders } from "./calibration-due";
import { enqueueMail, listRecipientsByRole } from "./enqueue-mail";
import { composeCalibrationDue } from "./messages";

/**
 * Queues one message to the admins for each instrument in use whose calibration falls due within
 * 30 days or is overdue, once per instrument and due date (the outbox's once_key refuses a second),
 * so running it every hour, in several processes, sends each reminder once. Returns how many it queued.
 */
export async function queueCalibrationReminders(now: Date = new Date()): Promise<number> {
  const today = readLabToday(now);
  return getDb()
    .transaction()
    .execute(async (tx) => {
      const admins = await listRecipientsByRole(tx, "admin");
      if (admins.length === 0) return 0;
      const inUse = await listInstruments(tx, { inUseOnly: true });
      const reminders = pickCalibrationReminders(
        inUse.map((i) => ({ id: i.id, name: `${INSTRUMENT_KIND_LABELS[i.kind]} ${i.identifier}`, dueOn: i.dueOn })),
        today,
      );
      let queued = 0;
      for (const r of reminders) {
        const mail = composeCalibrationDue({ instrument: r.instrument, dueOn: r.dueOn, daysLeft: r.daysLeft, instrumentId: r.instrumentId });
        const added = await enqueueMail(tx, {
          kind: "calibration-due",
          recipients: admins,
          ...mail,
          entityType: "instrument",
          entityId: r.instrumentId,
          onceKey: r.onceKey,
        });
        if (added) queued++;
      }
      return queued;
    });
}
