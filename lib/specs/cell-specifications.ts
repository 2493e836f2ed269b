import "server-only";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import {
  getCellSpecification,
  insertCellSpecification,
  lockCellSpecification,
  setDatasheet,
  updateCellSpecification,
} from "@/db/cell-specifications";
import { insertStoredFile } from "@/db/stored-files";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { deleteObject, putObject } from "@/lib/storage";
import { computeDesignation } from "@/protocols";
import { cellSpecificationInputSchema, type CellSpecificationInput } from "./cell-specifications-input";
import { checkDatasheetFile } from "./datasheet-file";

export { cellSpecificationInputSchema, type CellSpecificationInput };

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

function designationOf(data: CellSpecificationInput["data"]): string {
  const d = computeDesignation(data);
  if (!d.ok) throw new DomainError("invalid", d.message);
  return d.designation;
}

export async function createCellSpecification(actor: SignedInUser, input: CellSpecificationInput): Promise<string> {
  const designation = designationOf(input.data);
  return getDb().transaction().execute(async (tx) => {
    const id = await insertCellSpecification(tx, { ...input, designation, createdBy: actor.id });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "spec.create",
      entityType: "cell-specification",
      entityId: id,
      after: { maker: input.maker, model: input.model, designation, ...input.data },
    });
    return id;
  });
}

export async function editCellSpecification(actor: SignedInUser, id: string, input: CellSpecificationInput): Promise<void> {
  const designation = designationOf(input.data);
  await getDb().transaction().execute(async (tx) => {
    if (!(await lockCellSpecification(tx, id))) throw new DomainError("not-found", "No such cell specification.");
    const before = await getCellSpecification(tx, id);
    await updateCellSpecification(tx, id, { ...input, designation });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "spec.edit",
      entityType: "cell-specification",
      entityId: id,
      before: before && { maker: before.maker, model: before.model, designation: before.designation, ...before.data },
      after: { maker: input.maker, model: input.model, designation, ...input.data },
    });
  });
}

/**
 * Stores a datasheet PDF and links it to the specification. The file goes to storage first; if the
 * database write then fails, the stored object is removed again, so nothing is half-kept.
 */
export async function attachDatasheet(
  actor: SignedInUser,
  specId: string,
  file: { name: string; bytes: Uint8Array },
): Promise<{ fileId: string; sha256: string; sizeBytes: number }> {
  const check = await checkDatasheetFile(file);
  if (!check.ok) throw new DomainError("invalid", check.message);
  const spec = await getCellSpecification(getDb(), specId);
  if (!spec) throw new DomainError("not-found", "No such cell specification.");
  const key = `datasheets/${specId}/${randomUUID()}.pdf`;
  const stored = await putObject(key, file.bytes, "application/pdf");
  try {
    return await getDb().transaction().execute(async (tx) => {
      if (!(await lockCellSpecification(tx, specId))) throw new DomainError("not-found", "No such cell specification.");
      const f = await insertStoredFile(tx, {
        storageKey: key,
        originalName: file.name.slice(0, 200),
        contentType: "application/pdf",
        sizeBytes: stored.sizeBytes,
        sha256: stored.sha256,
        purpose: "datasheet",
        uploadedBy: actor.id,
      });
      await setDatasheet(tx, specId, f.id);
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: label(actor),
        action: "spec.attach-datasheet",
        entityType: "cell-specification",
        entityId: specId,
        before: spec.datasheet ? { datasheet: spec.datasheet.name, sha256: spec.datasheet.sha256 } : undefined,
        after: { datasheet: f.originalName, sha256: f.sha256, sizeBytes: f.sizeBytes },
      });
      return { fileId: f.id, sha256: f.sha256, sizeBytes: f.sizeBytes };
    });
  } catch (error) {
    await deleteObject(key).catch((e: unknown) => console.error(`could not remove orphaned ${key}`, e));
    throw error;
  }
}
