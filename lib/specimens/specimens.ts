import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { countSpecimensOfLot, lockLot } from "@/db/lots";
import { findSpecimenAtLotPosition, getSpecimen, insertSpecimen, specimenHasRuns, updateSpecimen, type SpecimenView } from "@/db/specimens";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { nameSpecification, refuseFutureReceipt } from "@/lib/lots/lot-records";
import { specimenInputSchema, type SpecimenInput, type SpecimenValues } from "./specimen-input";

export { specimenInputSchema, type SpecimenInput, type SpecimenValues };

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/**
 * A specimen of a lot must be of the lot's cell specification (the database checks it too), and a lot
 * holds no more specimens than cells were received. Its tray position, if given, is one of the lot's
 * positions not yet taken. Locks the lot for the rest of the transaction.
 */
async function checkLot(tx: Executor, input: SpecimenValues, specification: string, specimenId?: string): Promise<string | null> {
  if (!input.lotId) {
    if (input.lotPosition !== null) throw new DomainError("invalid", "A tray position belongs to a lot: choose the lot, or leave the position empty.");
    return null;
  }
  const lot = await lockLot(tx, input.lotId);
  if (!lot) throw new DomainError("invalid", "No such lot: choose one from the list, or none.");
  if (lot.cellSpecificationId !== input.cellSpecificationId) {
    const lotSpecification = await nameSpecification(tx, lot.cellSpecificationId);
    throw new DomainError("invalid", `Lot ${lot.identifier} holds ${lotSpecification} cells, not ${specification}: a specimen of a lot is of the lot's cell specification.`);
  }
  const registered = await countSpecimensOfLot(tx, input.lotId, { otherThan: specimenId });
  if (registered >= lot.quantityReceived) {
    throw new DomainError("conflict", `Lot ${lot.identifier} was received with ${lot.quantityReceived} cells and all of them are registered already.`);
  }
  if (input.lotPosition !== null) await checkLotPosition(tx, { ...lot, id: input.lotId }, input.lotPosition, specimenId);
  return lot.identifier;
}

async function checkLotPosition(tx: Executor, lot: { id: string; identifier: string; quantityReceived: number }, position: number, specimenId?: string) {
  if (position > lot.quantityReceived) {
    throw new DomainError("invalid", `Tray position ${position} is outside lot ${lot.identifier}: its cells are numbered 1 to ${lot.quantityReceived}.`);
  }
  const taken = await findSpecimenAtLotPosition(tx, lot.id, position);
  if (taken && taken.id !== specimenId) {
    throw new DomainError("conflict", `Tray position ${position} of lot ${lot.identifier} is already registered as specimen ${taken.identifier}.`);
  }
}

/**
 * Once a specimen has runs, its lot and tray position stay as they are: moving a tested cell to another
 * position could move its result into or out of the lot's drawn sample.
 */
async function refuseMovingTestedCell(tx: Executor, before: SpecimenView, input: SpecimenValues): Promise<void> {
  const moved = (before.lot?.id ?? null) !== input.lotId || before.lotPosition !== (input.lotId ? input.lotPosition : null);
  if (moved && before.lotPosition !== null && (await specimenHasRuns(tx, before.id))) {
    throw new DomainError(
      "conflict",
      `Specimen ${before.identifier} already has runs as tray position ${before.lotPosition} of lot ${before.lot?.identifier ?? "?"}; its lot and tray position cannot change.`,
    );
  }
}

const auditValues = (input: SpecimenValues, specification: string, lot: string | null) => ({
  identifier: input.identifier,
  specification,
  lot,
  lotPosition: input.lotId ? input.lotPosition : null,
  receivedOn: input.receivedOn,
  conditionOnReceipt: input.conditionOnReceipt,
  notes: input.notes,
});

export async function createSpecimen(actor: SignedInUser, input: SpecimenValues): Promise<string> {
  refuseFutureReceipt(input.receivedOn);
  return getDb().transaction().execute(async (tx) => {
    const specification = await nameSpecification(tx, input.cellSpecificationId);
    const lot = await checkLot(tx, input, specification);
    const id = await insertSpecimen(tx, { ...input, createdBy: actor.id });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "specimen.create",
      entityType: "specimen",
      entityId: id,
      after: auditValues(input, specification, lot),
    });
    return id;
  });
}

export async function editSpecimen(actor: SignedInUser, id: string, input: SpecimenValues): Promise<void> {
  refuseFutureReceipt(input.receivedOn);
  await getDb().transaction().execute(async (tx) => {
    const before = await getSpecimen(tx, id, { forUpdate: true });
    if (!before) throw new DomainError("not-found", "No such specimen.");
    await refuseMovingTestedCell(tx, before, input);
    const specification = await nameSpecification(tx, input.cellSpecificationId);
    const lot = await checkLot(tx, input, specification, id);
    await updateSpecimen(tx, id, input);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "specimen.edit",
      entityType: "specimen",
      entityId: id,
      before: {
        identifier: before.identifier,
        specification: `${before.specification.maker} ${before.specification.model}`,
        lot: before.lot?.identifier ?? null,
        lotPosition: before.lotPosition,
        receivedOn: before.receivedOn,
        conditionOnReceipt: before.conditionOnReceipt,
        notes: before.notes,
      },
      after: auditValues(input, specification, lot),
    });
  });
}
