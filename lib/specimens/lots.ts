import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCellSpecification } from "@/db/cell-specifications";
import { countSpecimensOfLot, getLot, insertLot, lockLot, updateLot } from "@/db/lots";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { readLabToday } from "@/lib/instruments/lab-today";
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
 * (they are of that specification), and its quantity never drops below the specimens registered.
 */
export async function editLot(actor: SignedInUser, id: string, input: LotInput): Promise<void> {
  refuseFutureReceipt(input.receivedOn);
  await getDb().transaction().execute(async (tx) => {
    if (!(await lockLot(tx, id))) throw new DomainError("not-found", "No such lot.");
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
        quantityReceived: before.quantityReceived,
        receivedOn: before.receivedOn,
        notes: before.notes,
      },
      after: auditValues(input, specification),
    });
  });
}
