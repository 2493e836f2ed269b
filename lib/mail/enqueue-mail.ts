import "server-only";
import type { Executor } from "@/db";
import type { MailKind } from "@/db/schema";

export interface OutgoingMail {
  kind: MailKind;
  recipients: readonly string[];
  subject: string;
  body: string;
  entityType?: string;
  entityId?: string;
  /** A message that must go once only (e.g. one calibration reminder per instrument and due date). */
  onceKey?: string;
}

/**
 * Writes a message to the outbox with the same transaction as the change it reports, so the change
 * and its notice commit together; sending happens afterwards (lib/mail/send-pending-mail.ts) and a
 * failed send is retried without touching the change. No recipients: nothing to send, nothing written.
 * Returns false when a message with the same onceKey already exists.
 */
export async function enqueueMail(tx: Executor, mail: OutgoingMail): Promise<boolean> {
  const recipients = [...new Set(mail.recipients.map((r) => r.trim().toLowerCase()).filter(Boolean))];
  if (recipients.length === 0) return false;
  const inserted = await tx
    .insertInto("mail_message")
    .values({
      kind: mail.kind,
      recipients,
      subject: mail.subject,
      body: mail.body,
      entity_type: mail.entityType ?? null,
      entity_id: mail.entityId ?? null,
      once_key: mail.onceKey ?? null,
    })
    .onConflict((oc) => oc.column("once_key").doNothing())
    .returning("id")
    .executeTakeFirst();
  return inserted !== undefined;
}

/** E-mail addresses of the active users with a role: who a notice goes to. */
export async function listRecipientsByRole(db: Executor, role: "admin" | "engineer" | "operator" | "auditor"): Promise<string[]> {
  const rows = await db.selectFrom("app_user").select("email").where("role", "=", role).where("active", "=", true).orderBy("email").execute();
  return rows.map((r) => r.email);
}
