import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getInstrument, insertInstrument, setInstrumentActive, updateInstrument, type InstrumentView } from "@/db/instruments";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { describeAccuracy } from "./describe-accuracy";
import { instrumentInputSchema, type InstrumentInput } from "./instrument-input";
import { INSTRUMENT_KIND_LABELS } from "./instrument-kind";
import { readLabToday } from "./lab-today";

export { instrumentInputSchema, type InstrumentInput };

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/** What the audit trail keeps of an instrument: every value, the accuracy in words. */
function auditValues(i: InstrumentInput | InstrumentView) {
  return {
    kind: INSTRUMENT_KIND_LABELS[i.kind],
    identifier: i.identifier,
    serial: i.serial,
    firmware: i.firmware,
    accuracy: describeAccuracy(i.accuracy).map((p) => p.text).join("; "),
    calibrationCertificate: i.calibrationCertificate,
    calibratedOn: i.calibratedOn,
    dueOn: i.dueOn,
  };
}

function refuseFutureCalibration(input: InstrumentInput): void {
  if (input.calibratedOn > readLabToday()) throw new DomainError("invalid", `The calibration date ${input.calibratedOn} is in the future.`);
}

async function lockInstrument(tx: Executor, id: string): Promise<InstrumentView> {
  const i = await getInstrument(tx, id, { forUpdate: true });
  if (!i) throw new DomainError("not-found", "No such instrument.");
  return i;
}

export async function createInstrument(actor: SignedInUser, input: InstrumentInput): Promise<string> {
  refuseFutureCalibration(input);
  return getDb().transaction().execute(async (tx) => {
    const id = await insertInstrument(tx, { ...input, createdBy: actor.id });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "instrument.create",
      entityType: "instrument",
      entityId: id,
      after: auditValues(input),
    });
    return id;
  });
}

export async function editInstrument(actor: SignedInUser, id: string, input: InstrumentInput): Promise<void> {
  refuseFutureCalibration(input);
  await getDb().transaction().execute(async (tx) => {
    const before = await lockInstrument(tx, id);
    await updateInstrument(tx, id, input);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "instrument.edit",
      entityType: "instrument",
      entityId: id,
      before: auditValues(before),
      after: auditValues(input),
    });
  });
}

/** Takes an instrument out of use (broken, sent away, retired); the register keeps it and its history. */
export async function deactivateInstrument(actor: SignedInUser, id: string): Promise<InstrumentView> {
  return changeInUse(actor, id, false);
}

export async function reactivateInstrument(actor: SignedInUser, id: string): Promise<InstrumentView> {
  return changeInUse(actor, id, true);
}

async function changeInUse(actor: SignedInUser, id: string, active: boolean): Promise<InstrumentView> {
  return getDb().transaction().execute(async (tx) => {
    const before = await lockInstrument(tx, id);
    if (before.active === active) {
      throw new DomainError("conflict", `${before.identifier} is already ${active ? "in use" : "deactivated"}.`);
    }
    await setInstrumentActive(tx, id, active);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: active ? "instrument.reactivate" : "instrument.deactivate",
      entityType: "instrument",
      entityId: id,
      before: { identifier: before.identifier, active: before.active },
      after: { identifier: before.identifier, active },
    });
    return { ...before, active };
  });
}
