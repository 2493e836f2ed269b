import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { countSpecimensOfLot, lockLot } from "@/db/lots";
import { getSpecimen, insertSpecimen, updateSpecimen } from "@/db/specimens";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { nameSpecification, refuseFutureReceipt } from "./lots";
import { specimenInputSchema, type SpecimenInput, type SpecimenValues } from "./specimen-input";

export { specimenInputSchema, type SpecimenInput, type SpecimenValues };

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/**
 * A specimen of a lot must be of the lot's cell specification (the database checks it too), and a lot
 * holds no more specimens than cells were received. Locks the lot for the rest of the transaction.
 */
async function checkLot(tx: Executor, input: SpecimenValues, specification: string, specimenId?: string): Promise<string | null> {
  if (!input.lotId) return null;
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
  return lot.identifier;
}

const auditValues = (input: SpecimenValues, specification: string, lot: string | null) => ({
  identifier: input.identifier,
  specification,
  lot,
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
        receivedOn: before.receivedOn,
        conditionOnReceipt: before.conditionOnReceipt,
        notes: before.notes,
      },
      after: auditValues(input, specification, lot),
    });
  });
}
