import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCellSpecification } from "@/db/cell-specifications";
import { countSpecimensOfLot, getHighestLotPosition, getLot, insertLot, lockLot, updateLot } from "@/db/lots";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { readLabToday } from "@/lib/instruments/lab-today";
import { replanForNewLotSize } from "@/lib/lots/sampling/replan-for-lot-size";
import { lotInputSchema, type LotInput } from "./lot-input";

export { lotInputSchema, type LotInput };

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/** The specification's name as people say it, or a refusal if it does not exist. */
export async function nameSpecification(tx: Executor, id: string): Promise<string> {
  const spec = await getCellSpecification(tx, id);
  if (!spec) throw new DomainError("invalid", "No such cell specification: choose one from the list.");
  return `${spec.maker} ${spec.model}`;
}

export function refuseFutureReceipt(receivedOn: string): void {
  if (receivedOn > readLabToday()) throw new DomainError("invalid", `The receipt date ${receivedOn} is in the future.`);
}

const auditValues = (input: LotInput, specification: string) => ({
  identifier: input.identifier,
  specification,
  supplier: input.supplier,
  customer: input.customer,
  quantityReceived: input.quantityReceived,
  receivedOn: input.receivedOn,
  notes: input.notes,
});

export async function createLot(actor: SignedInUser, input: LotInput): Promise<string> {
  refuseFutureReceipt(input.receivedOn);
  return getDb().transaction().execute(async (tx) => {
    const specification = await nameSpecification(tx, input.cellSpecificationId);
    const id = await insertLot(tx, { ...input, createdBy: actor.id });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "lot.create",
      entityType: "lot",
      entityId: id,
      after: auditValues(input, specification),
    });
    return id;
  });
}

/**
 * Changes a lot's record. Its cell specification stays fixed once specimens are registered from it
 * (they are of that specification), and its quantity never drops below the specimens registered nor
 * below the highest tray position registered. A new quantity recomputes the sampling plan before the
 * draw and is refused after it.
 */
export async function editLot(actor: SignedInUser, id: string, input: LotInput): Promise<void> {
  refuseFutureReceipt(input.receivedOn);
  await getDb().transaction().execute(async (tx) => {
    const locked = await lockLot(tx, id);
    if (!locked) throw new DomainError("not-found", "No such lot.");
    const before = await getLot(tx, id);
    if (!before) throw new DomainError("not-found", "No such lot.");
    const specimens = await countSpecimensOfLot(tx, id);
    const specification = await nameSpecification(tx, input.cellSpecificationId);
    const oldSpecification = `${before.specification.maker} ${before.specification.model}`;
    if (specimens > 0 && input.cellSpecificationId !== before.specification.id) {
      throw new DomainError("conflict", `Lot ${before.identifier} already has ${specimens} ${specimens === 1 ? "specimen" : "specimens"} of ${oldSpecification}; its cell specification cannot change.`);
    }
    if (input.quantityReceived < specimens) {
      throw new DomainError("invalid", `Lot ${before.identifier} already has ${specimens} specimens registered: the quantity received cannot be less.`);
    }
    const highestPosition = await getHighestLotPosition(tx, id);
    if (input.quantityReceived < highestPosition) {
      throw new DomainError("invalid", `A specimen of lot ${before.identifier} is registered at tray position ${highestPosition}: the quantity received cannot be less.`);
    }
    const replanned = await replanForNewLotSize(tx, { id, identifier: before.identifier, quantityReceived: locked.quantityReceived }, input.quantityReceived);
    await updateLot(tx, id, input);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "lot.edit",
      entityType: "lot",
      entityId: id,
      before: {
        identifier: before.identifier,
        specification: oldSpecification,
        supplier: before.supplier,
        customer: before.customer,
        quantityReceived: before.quantityReceived,
        receivedOn: before.receivedOn,
        notes: before.notes,
      },
      after: auditValues(input, specification),
      ...(replanned && { detail: { samplingPlan: `${replanned.before} → ${replanned.after}` } }),
    });
  });
}
