import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import type { SignatureMeaning } from "@/db/schema";
import { getUserCredentials } from "@/db/users";
import { verifyPassword } from "@/lib/auth/password";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";

/** What a signed record shows wherever it is shown (21 CFR 11.50): printed name, date and time, meaning. */
export interface SignatureManifestation {
  id: string;
  printedName: string;
  meaning: SignatureMeaning;
  signedAt: Date;
}

export const SIGNATURE_MEANING_WORDS: Record<SignatureMeaning, string> = {
  reviewed: "reviewed: checked the records, findings and results against the procedure",
  approved: "approved: authorised the certificate for issue",
  released: "approved for use: released this procedure version for operators to run",
};

/**
 * The second component of a signature (21 CFR 11.200: identity and password). Call it before the
 * transaction that signs; a wrong password is written to the audit trail on its own (on the record it was
 * meant for, so the record's history shows it) and nothing is signed.
 */
export async function confirmSignerPassword(
  signer: SignedInUser,
  password: string,
  what: string,
  record?: { entityType: "run" | "lot" | "certificate" | "procedure-version"; entityId: string },
): Promise<void> {
  const credentials = await getUserCredentials(getDb(), signer.email);
  const ok = credentials !== null && credentials.active && credentials.id === signer.id && (await verifyPassword(credentials.passwordHash, password));
  if (ok) return;
  await recordAuditEvent(getDb(), {
    actorId: signer.id,
    actorLabel: `${signer.displayName} <${signer.email}>`,
    action: "signature.refused",
    ...(record && { entityType: record.entityType, entityId: record.entityId }),
    detail: { what, reason: "wrong password" },
  });
  throw new DomainError("invalid", "That password is not right. Nothing was signed.");
}

/**
 * Writes one electronic signature, linked to the record by the SHA-256 of its canonical content.
 * The database refuses a second signature of the same meaning on the same record, and a signature
 * by the operator of the run signed for (migrations/0005).
 */
export async function insertSignature(
  tx: Executor,
  input: { signer: SignedInUser; meaning: SignatureMeaning; entityType: "run" | "certificate" | "procedure-version"; entityId: string; recordSha256: string },
): Promise<SignatureManifestation> {
  const row = await tx
    .insertInto("electronic_signature")
    .values({
      signer_id: input.signer.id,
      printed_name: input.signer.displayName,
      meaning: input.meaning,
      entity_type: input.entityType,
      entity_id: input.entityId,
      record_sha256: input.recordSha256,
    })
    .returning(["id", "printed_name", "meaning", "signed_at"])
    .executeTakeFirstOrThrow();
  return { id: row.id, printedName: row.printed_name, meaning: row.meaning, signedAt: row.signed_at };
}

export async function getSignature(db: Executor, id: string): Promise<SignatureManifestation | null> {
  const row = await db
    .selectFrom("electronic_signature")
    .select(["id", "printed_name", "meaning", "signed_at"])
    .where("id", "=", id)
    .executeTakeFirst();
  return row ? { id: row.id, printedName: row.printed_name, meaning: row.meaning, signedAt: row.signed_at } : null;
}

/** The release signature of each procedure version that carries one, by version id. */
export async function listReleaseSignatures(db: Executor, versionIds: readonly string[]): Promise<Map<string, SignatureManifestation>> {
  if (versionIds.length === 0) return new Map();
  const rows = await db
    .selectFrom("electronic_signature")
    .select(["id", "printed_name", "meaning", "signed_at", "entity_id"])
    .where("entity_type", "=", "procedure-version")
    .where("meaning", "=", "released")
    .where("entity_id", "in", [...versionIds])
    .execute();
  return new Map(rows.map((r) => [r.entity_id, { id: r.id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at }]));
}
