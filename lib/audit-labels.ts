import { describeCautionCode } from "@/protocols";

/** Audit actions in plain words for the trail's readers. Unknown actions show their code. */
export const AUDIT_ACTION_LABELS: Record<string, string> = {
  "auth.sign-in": "signed in",
  "auth.sign-out": "signed out",
  "auth.sign-in-failed": "failed sign-in",
  "auth.sign-in-refused": "sign-in refused (too many failures)",
  "user.create": "added a user",
  "user.change-role": "changed a role",
  "user.deactivate": "deactivated a user",
  "user.reactivate": "reactivated a user",
  "security.foreign-origin-refused": "refused a request from another site",
  "spec.create": "added a cell specification",
  "spec.edit": "changed a cell specification",
  "spec.attach-datasheet": "attached a datasheet",
  "procedure.create": "created a procedure",
  "procedure.save-draft": "saved a procedure draft",
  "procedure.submit": "submitted a procedure for review",
  "procedure.return": "returned a procedure to draft",
  "procedure.release": "released a procedure version",
  "procedure.withdraw": "withdrew a procedure version",
  "procedure.new-draft": "started a new procedure draft",
  "instrument.create": "registered an instrument",
  "instrument.edit": "changed an instrument",
  "instrument.deactivate": "took an instrument out of use",
  "instrument.reactivate": "put an instrument back into use",
  "lot.create": "registered a lot",
  "lot.edit": "changed a lot",
  "specimen.create": "registered a specimen",
  "specimen.edit": "changed a specimen",
  "run.plan": "planned a run",
  "run.record-step": "recorded a step of a run",
  "run.change-step-times": "changed the recorded times of a step (with a reason)",
  "run.correct-step": "corrected a step's record: old entries struck, kept, with a reason",
  "run.abandon": "abandoned a run (with a reason; its records are kept)",
  "run.submit": "submitted a run for review (engineers notified)",
  "run.upload-log": "stored a run's data log (read in full)",
  "run.receive-log": "sent a data log to be read",
  "run.refuse-log": "had a data log refused",
  "run.evaluate": "checked a run against its procedure",
  "run.return": "returned a run to its operator with comments",
  "run.accept": "accepted a run and signed it as reviewed",
  "signature.refused": "refused a signature (wrong password)",
  "mail.failed": "an e-mail could not be sent (tried again later)",
  "certificate.issue": "signed and issued a certificate",
  "certificate.amend": "issued an amended certificate that replaces an earlier one",
  "certificate.supersede": "a certificate was replaced by an amendment",
  "certificate.revoke": "revoked a certificate (with a reason)",
  "run.certify": "a run was certified",
  "lot.set-sampling-plan": "set a lot's sampling plan",
  "lot.draw-sample": "drew a lot's sample",
  "storage.integrity-fault": "a stored file was refused: missing, or not the bytes recorded at upload",
  "storage.repair": "a stored file was repaired to the bytes recorded at upload",
  "signing-key.generate": "created the lab's signing key (self-signed) and stored it, encrypted, in the database",
  "signing-key.import": "moved the lab's signing key from the server's data folder into the database, encrypted",
};

/** An action in words; one not in the list is still said in words ("run: something new"), never as its code. */
export function describeAuditAction(action: string): string {
  const known = AUDIT_ACTION_LABELS[action];
  if (known) return known;
  const [area = "", ...rest] = action.split(".");
  return `${wordsOf(area)}: ${wordsOf(rest.join(" "))}`;
}

/** The kinds of record the trail names, in words. */
export const AUDIT_RECORD_TYPES: Record<string, string> = {
  user: "user",
  "cell-specification": "cell specification",
  "procedure-version": "procedure",
  run: "run",
  instrument: "instrument",
  lot: "lot",
  specimen: "specimen",
  certificate: "certificate",
  "mail-message": "e-mail",
  "lab-signing-key": "signing key",
};

/** "procedure TPL-RC20 version 2", "run R-00012"; a record whose name is unknown is named by its kind only. */
export function describeAuditRecord(entityType: string | null, entityLabel: string | null): string {
  if (!entityType) return "—";
  const kind = AUDIT_RECORD_TYPES[entityType] ?? wordsOf(entityType);
  return entityLabel ? `${kind} ${entityLabel}` : `a ${kind} (name not known)`;
}

/** Field names of the trail's before/after/detail in words; others are split from camelCase. */
const FIELD_WORDS: Record<string, string> = {
  endedSessions: "sessions ended",
  steps: "number of steps",
  stepId: "step",
  from: "from version",
  sha256: "SHA-256",
  displayName: "name",
  valueC: "°C",
  recordSha256: "SHA-256 of the signed record",
  acknowledgedCautionCodes: "cautions acknowledged",
  at: "at",
};

/**
 * What changed, as short lines a reader can scan, each "field: was → now" ("active: yes → no"). A
 * creation lists the new values; details (reasons, counts) follow. Values are words: never JSON or ids.
 */
export function summariseAuditChange(before: unknown, after: unknown, detail: unknown): string[] {
  const lines: string[] = [];
  const b = isRecord(before) ? before : null;
  const a = isRecord(after) ? after : null;
  if (a && !b) {
    for (const [k, v] of Object.entries(a)) lines.push(`${fieldWords(k)}: ${show(v)}`);
  } else if (a && b) {
    for (const k of new Set([...Object.keys(b), ...Object.keys(a)])) {
      if (JSON.stringify(b[k]) !== JSON.stringify(a[k])) lines.push(`${fieldWords(k)}: ${show(b[k])} → ${show(a[k])}`);
    }
  }
  if (isRecord(detail)) {
    for (const [k, v] of Object.entries(detail)) lines.push(`${fieldWords(k)}: ${show(v)}`);
  }
  return lines.filter((line) => !line.endsWith(": "));
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

const CAUTION_CODE = /^[a-z]+(?:-[a-z]+)+\/[^/\s]+\/[\w.]+$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function wordsOf(code: string): string {
  return code
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/[_.-]+/g, " ")
    .toLowerCase()
    .trim();
}

function fieldWords(key: string): string {
  return FIELD_WORDS[key] ?? wordsOf(key);
}

function show(v: unknown): string {
  if (v === true) return "yes";
  if (v === false) return "no";
  if (v === null || v === undefined) return "—";
  if (typeof v === "number") return String(v);
  if (typeof v === "string") {
    if (UUID.test(v)) return "(a record)";
    if (CAUTION_CODE.test(v)) return describeCautionCode(v, []);
    // Stored state names (in_review, in_progress) read as words.
    return /^[a-z]+(_[a-z]+)+$/.test(v) ? v.replace(/_/g, " ") : v;
  }
  if (Array.isArray(v)) return v.length === 0 ? "none" : v.map(show).join(", ");
  if (isRecord(v)) {
    const parts = Object.entries(v).map(([k, x]) => `${fieldWords(k)} ${show(x)}`);
    return parts.length === 0 ? "—" : parts.join("; ");
  }
  return String(v);
}
