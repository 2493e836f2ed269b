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
  "run.upload-log": "uploaded a run's data log",
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
};

export function describeAuditAction(action: string): string {
  return AUDIT_ACTION_LABELS[action] ?? action;
}

/**
 * What changed, as short lines a reader can scan: "active: yes → no". A creation lists the new
 * values; details (reasons, counts) follow.
 */
export function summariseAuditChange(before: unknown, after: unknown, detail: unknown): string[] {
  const lines: string[] = [];
  const b = isRecord(before) ? before : null;
  const a = isRecord(after) ? after : null;
  if (a && !b) {
    for (const [k, v] of Object.entries(a)) lines.push(`${k}: ${show(v)}`);
  } else if (a && b) {
    for (const k of new Set([...Object.keys(b), ...Object.keys(a)])) {
      if (JSON.stringify(b[k]) !== JSON.stringify(a[k])) lines.push(`${k}: ${show(b[k])} → ${show(a[k])}`);
    }
  }
  if (isRecord(detail)) {
    for (const [k, v] of Object.entries(detail)) lines.push(`${k}: ${show(v)}`);
  }
  return lines;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function show(v: unknown): string {
  if (v === true) return "yes";
  if (v === false) return "no";
  if (v === null || v === undefined) return "—";
  return typeof v === "string" ? v : JSON.stringify(v);
}
