import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { translateConstraintError } from "@/db/constraint-errors";
import { getInstrument } from "@/db/instruments";
import { assertInstrumentsUsable } from "@/lib/instruments/assert-instruments-usable";
import { addDays } from "@/lib/instruments/calendar-date";
import { createInstrument, deactivateInstrument, editInstrument, instrumentInputSchema, reactivateInstrument } from "@/lib/instruments/instruments";
import { readLabToday } from "@/lib/instruments/lab-today";
import { makeUser } from "./fixtures";

const today = readLabToday();
let n = 0;

/** A cycler channel due `dueInDays` from today; each call registers its own identifier (the tests of a file share a database). */
function channel(dueInDays: number) {
  const dueOn = addDays(today, dueInDays);
  return instrumentInputSchema.parse({
    kind: "cycler-channel",
    identifier: `IT-CH${String(++n).padStart(2, "0")}`,
    serial: `IT-${n}`,
    firmware: "1.0",
    accuracy: {
      current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
      voltage: { percentOfReading: 0.02, percentOfRange: 0.02, range: 5 },
      time: { ppm: 100 },
    },
    calibrationCertificate: `IT-CAL-${n}`,
    calibratedOn: addDays(dueOn, -365),
    dueOn,
  });
}

const auditOf = (id: string) =>
  getDb().selectFrom("audit_event").select(["action", "before", "after", "actor_id"]).where("entity_id", "=", id).orderBy("id").execute();

describe("the instrument register", () => {
  it("records a registration, an edit and a deactivation each with its audit event", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const input = channel(200);
    const id = await createInstrument(admin, input);
    const stored = await getInstrument(getDb(), id);
    expect(stored).toMatchObject({ identifier: input.identifier, kind: "cycler-channel", dueOn: input.dueOn, calibratedOn: input.calibratedOn, accuracy: input.accuracy, active: true });

    const recalibrated = { ...input, calibrationCertificate: "IT-CAL-NEW", calibratedOn: today, dueOn: addDays(today, 365) };
    await editInstrument(admin, id, recalibrated);
    await deactivateInstrument(admin, id);
    expect((await getInstrument(getDb(), id))?.active).toBe(false);
    await expect(deactivateInstrument(admin, id)).rejects.toThrow(/already deactivated/);

    const events = await auditOf(id);
    expect(events.map((e) => e.action)).toEqual(["instrument.create", "instrument.edit", "instrument.deactivate"]);
    expect(events.every((e) => e.actor_id === admin.id)).toBe(true);
    expect(events[0]?.after).toMatchObject({ identifier: input.identifier, dueOn: input.dueOn, accuracy: expect.stringContaining("Current ±(0.05 % of reading + 0.05 % of 5 A range)") });
    expect(events[1]?.before).toMatchObject({ calibrationCertificate: input.calibrationCertificate });
    expect(events[1]?.after).toMatchObject({ calibrationCertificate: "IT-CAL-NEW", dueOn: recalibrated.dueOn });
    expect(events[2]?.after).toEqual({ identifier: input.identifier, active: false });
  });

  it("keeps the register unchanged when a write fails, audit included", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const input = channel(100);
    await createInstrument(admin, input);
    const error = await createInstrument(admin, { ...input, serial: "other" }).catch((e: unknown) => e);
    expect(translateConstraintError(error)?.message).toBe("An instrument with this identifier is already registered.");
    const rows = await getDb().selectFrom("instrument").select("id").where("identifier", "=", input.identifier).execute();
    expect(rows).toHaveLength(1);
    const audits = await getDb().selectFrom("audit_event").select("id").where("action", "=", "instrument.create").where("entity_id", "=", rows[0]!.id).execute();
    expect(audits).toHaveLength(1);
  });

  it("refuses a calibration dated in the future", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const input = channel(400);
    await expect(createInstrument(admin, { ...input, calibratedOn: addDays(today, 1) })).rejects.toThrow(/is in the future/);
  });

  it("has the database refuse a due date not after the calibration date and an unknown kind", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const row = { identifier: "IT-RAW", serial: "x", accuracy: "{}", calibration_certificate: "c", created_by: admin.id };
    const sameDay = await getDb()
      .insertInto("instrument")
      .values({ ...row, kind: "balance", calibrated_on: today, due_on: today })
      .execute()
      .catch((e: unknown) => e);
    expect(translateConstraintError(sameDay)?.message).toBe("The calibration due date must be after the calibration date.");
    const unknownKind = await getDb()
      .insertInto("instrument")
      // @ts-expect-error: a kind outside the list, as a raw write could send it
      .values({ ...row, kind: "oscilloscope", calibrated_on: today, due_on: addDays(today, 1) })
      .execute()
      .catch((e: unknown) => e);
    expect(translateConstraintError(unknownKind)?.message).toBe("Choose a kind of instrument from the list.");
  });
});

describe("assertInstrumentsUsable", () => {
  it("lets a run start on instruments in calibration, due today included", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const ids = [await createInstrument(admin, channel(0)), await createInstrument(admin, channel(30)), await createInstrument(admin, channel(300))];
    await expect(assertInstrumentsUsable(getDb(), ids, today)).resolves.toBeUndefined();
  });

  it("names each overdue, deactivated or unknown instrument", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const fine = channel(60);
    const good = await createInstrument(admin, fine);
    // Registered while valid, then read on a later day: the calibration has run out by then.
    const soon = channel(5);
    const lapsing = await createInstrument(admin, soon);
    const retired = channel(90);
    const retiredId = await createInstrument(admin, retired);
    await deactivateInstrument(admin, retiredId);
    const later = addDays(today, 7);
    const missing = "00000000-0000-4000-8000-000000000000";

    const error = await assertInstrumentsUsable(getDb(), [good, lapsing, retiredId, missing, "not-a-uuid"], later).catch((e: unknown) => e);
    expect(error).toMatchObject({ name: "DomainError", code: "conflict" });
    const message = (error as Error).message;
    expect(message).toContain(`cycler channel ${soon.identifier} is overdue for calibration (due on ${soon.dueOn}, 2 days ago)`);
    expect(message).toContain(`cycler channel ${retired.identifier} is deactivated`);
    expect(message).toContain(`instrument ${missing} is not in the register`);
    expect(message).toContain("instrument not-a-uuid is not in the register");
    expect(message).not.toContain(fine.identifier);

    await reactivateInstrument(admin, retiredId);
    await expect(assertInstrumentsUsable(getDb(), [good, retiredId], later)).resolves.toBeUndefined();
  });
});
