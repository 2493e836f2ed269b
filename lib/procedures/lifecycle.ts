import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import {
  getProcedureIdByCode,
  getProcedureVersionById,
  insertProcedure,
  insertProcedureVersion,
  listProcedureVersions,
  nextVersionNumber,
  setProcedureVersionStatus,
  updateProcedureVersionContent,
  type ProcedureVersionView,
} from "@/db/procedures";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { DomainError } from "@/lib/errors";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { enqueueMail } from "@/lib/mail/enqueue-mail";
import { composeProcedureAwaitingRelease } from "@/lib/mail/messages";
import { confirmSignerPassword, insertSignature, type SignatureManifestation } from "@/lib/signatures/sign-record";
import type { ProcedureDraftInput } from "./procedure-input";

// Versions move draft → in review → released → withdrawn. A released version never changes (the
// database refuses it too); editing one starts a new draft. Every transition is audited.

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

async function audit(tx: Executor, actor: SignedInUser, action: string, v: { id: string; code: string; number: number }, extra: { before?: unknown; after?: unknown; detail?: unknown } = {}) {
  await recordAuditEvent(tx, {
    actorId: actor.id,
    actorLabel: label(actor),
    action,
    entityType: "procedure-version",
    entityId: v.id,
    detail: { code: v.code, version: v.number, ...(extra.detail as object | undefined) },
    before: extra.before,
    after: extra.after,
  });
}

async function lockVersion(tx: Executor, versionId: string): Promise<ProcedureVersionView> {
  const v = await getProcedureVersionById(tx, versionId, { forUpdate: true });
  if (!v) throw new DomainError("not-found", "No such procedure version.");
  return v;
}

export async function createProcedure(actor: SignedInUser, input: ProcedureDraftInput): Promise<{ procedureId: string; versionId: string; number: number }> {
  return getDb().transaction().execute(async (tx) => {
    const code = input.definition.header.code;
    if (await getProcedureIdByCode(tx, code)) throw new DomainError("conflict", `A procedure with the code ${code} already exists.`);
    const procedureId = await insertProcedure(tx, { code, createdBy: actor.id });
    const versionId = await insertProcedureVersion(tx, { procedureId, number: 1, authorId: actor.id, ...input });
    await audit(tx, actor, "procedure.create", { id: versionId, code, number: 1 }, { after: { title: input.definition.header.title, steps: input.definition.steps.length } });
    return { procedureId, versionId, number: 1 };
  });
}

export async function saveDraft(actor: SignedInUser, versionId: string, input: ProcedureDraftInput): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const v = await lockVersion(tx, versionId);
    if (v.status !== "draft") throw new DomainError("conflict", `Version ${v.number} is ${describeStatus(v.status)}; only a draft can be edited.`);
    if (input.definition.header.code !== v.code) {
      throw new DomainError("invalid", `The code of a procedure stays the same across versions (${v.code}).`);
    }
    await updateProcedureVersionContent(tx, versionId, input);
    await audit(tx, actor, "procedure.save-draft", v, {
      before: { title: v.title, steps: v.definition.steps.length },
      after: { title: input.definition.header.title, steps: input.definition.steps.length },
    });
  });
}

export async function submitForReview(actor: SignedInUser, versionId: string): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const v = await lockVersion(tx, versionId);
    if (v.status !== "draft") throw new DomainError("conflict", `Version ${v.number} is ${describeStatus(v.status)}; only a draft can be submitted.`);
    await setProcedureVersionStatus(tx, versionId, { status: "in_review", by: actor.id });
    await audit(tx, actor, "procedure.submit", v, { before: { status: v.status }, after: { status: "in_review" } });
    // The engineers who may release it are told, in the same transaction; never its author or submitter.
    const engineers = (
      await tx.selectFrom("app_user").select("email").where("role", "=", "engineer").where("active", "=", true).where("id", "not in", [v.author.id, actor.id]).orderBy("email").execute()
    ).map((r) => r.email);
    const notice = composeProcedureAwaitingRelease({ procedureId: v.procedureId, code: v.code, number: v.number, title: v.title, submitterName: actor.displayName });
    await enqueueMail(tx, { kind: "procedure-awaiting-release", recipients: engineers, ...notice, entityType: "procedure-version", entityId: versionId });
  });
  kickMailDispatch();
}

export async function returnToDraft(actor: SignedInUser, versionId: string, comment: string): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const v = await lockVersion(tx, versionId);
    if (v.status !== "in_review") throw new DomainError("conflict", `Version ${v.number} is ${describeStatus(v.status)}, not in review.`);
    await setProcedureVersionStatus(tx, versionId, { status: "draft" });
    await audit(tx, actor, "procedure.return", v, { before: { status: v.status }, after: { status: "draft" }, detail: { comment } });
  });
}

/** What a release signature is linked to: the SHA-256 of the version's content, as released. */
export function hashReleasedContent(v: Pick<ProcedureVersionView, "id" | "code" | "number" | "definition" | "instructions" | "cautions" | "acknowledgedCautions">): string {
  return hashCanonicalJson({
    versionId: v.id,
    code: v.code,
    number: v.number,
    definition: v.definition,
    instructions: v.instructions,
    cautions: v.cautions,
    acknowledgedCautions: v.acknowledgedCautions,
  });
}

function assertReleasable(actor: SignedInUser, v: ProcedureVersionView): void {
  if (v.status !== "in_review") throw new DomainError("conflict", `Version ${v.number} is ${describeStatus(v.status)}; only a version in review can be released.`);
  if (v.author.id === actor.id || v.submittedBy?.id === actor.id) {
    throw new DomainError("forbidden", "A second engineer must release this version: you wrote or submitted it.");
  }
}

/**
 * A second engineer releases, with an electronic signature meaning "approved for use" (password asked
 * again, 21 CFR 11.200): never the author, never whoever submitted it (also database checks). Plain
 * refusals come before the password; a wrong password is audited on the version and nothing changes.
 */
export async function signAndReleaseVersion(actor: SignedInUser, versionId: string, password: string): Promise<SignatureManifestation> {
  const v = await getProcedureVersionById(getDb(), versionId);
  if (!v) throw new DomainError("not-found", "No such procedure version.");
  assertReleasable(actor, v);
  await confirmSignerPassword(actor, password, `release of ${v.code} version ${v.number} (meaning: approved for use)`, {
    entityType: "procedure-version",
    entityId: versionId,
  });
  return releaseVersion(actor, versionId);
}

/**
 * Releases a version and writes its release signature, in one transaction. The workbench reaches it
 * only through signAndReleaseVersion (password first); the demo seed and test fixtures call it directly.
 * The author's "last saved" time stays as it was: releasing changes the status, not the content.
 */
export async function releaseVersion(actor: SignedInUser, versionId: string): Promise<SignatureManifestation> {
  return getDb().transaction().execute(async (tx) => {
    const v = await lockVersion(tx, versionId);
    assertReleasable(actor, v);
    // The version released before this one is superseded: it stays readable but no longer runs.
    for (const older of await listProcedureVersions(tx, v.procedureId)) {
      if (older.status === "released") {
        await setProcedureVersionStatus(tx, older.id, { status: "withdrawn", by: actor.id, reason: `superseded by version ${v.number}` });
        await audit(tx, actor, "procedure.withdraw", older, { before: { status: "released" }, after: { status: "withdrawn" }, detail: { reason: `superseded by version ${v.number}` } });
      }
    }
    const signature = await insertSignature(tx, { signer: actor, meaning: "released", entityType: "procedure-version", entityId: versionId, recordSha256: hashReleasedContent(v) });
    await setProcedureVersionStatus(tx, versionId, { status: "released", by: actor.id });
    await audit(tx, actor, "procedure.release", v, { before: { status: v.status }, after: { status: "released" }, detail: { signature: "approved for use" } });
    return signature;
  });
}

export async function withdrawVersion(actor: SignedInUser, versionId: string, reason: string): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const v = await lockVersion(tx, versionId);
    if (v.status !== "released") throw new DomainError("conflict", `Version ${v.number} is ${describeStatus(v.status)}; only a released version can be withdrawn.`);
    await setProcedureVersionStatus(tx, versionId, { status: "withdrawn", by: actor.id, reason });
    await audit(tx, actor, "procedure.withdraw", v, { before: { status: v.status }, after: { status: "withdrawn" }, detail: { reason } });
  });
}

/** Editing a released (or withdrawn) version: a new draft with the same content and the next number. */
export async function startNewDraft(actor: SignedInUser, fromVersionId: string): Promise<{ versionId: string; number: number }> {
  return getDb().transaction().execute(async (tx) => {
    const from = await lockVersion(tx, fromVersionId);
    if (from.status === "draft" || from.status === "in_review") {
      throw new DomainError("conflict", `Version ${from.number} is still ${describeStatus(from.status)}; edit it instead.`);
    }
    const number = await nextVersionNumber(tx, from.procedureId);
    const versionId = await insertProcedureVersion(tx, {
      procedureId: from.procedureId,
      number,
      authorId: actor.id,
      definition: from.definition,
      instructions: from.instructions,
      cautions: from.cautions,
      acknowledgedCautions: from.acknowledgedCautions,
    });
    await audit(tx, actor, "procedure.new-draft", { id: versionId, code: from.code, number }, { detail: { from: from.number } });
    return { versionId, number };
  });
}

export function describeStatus(status: ProcedureVersionView["status"]): string {
  switch (status) {
    case "draft":
      return "a draft";
    case "in_review":
      return "in review";
    case "released":
      return "released";
    case "withdrawn":
      return "withdrawn";
  }
}
