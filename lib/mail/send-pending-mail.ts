import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { claimDueMail, markMailFailed, markMailSent, type OutboxMessage } from "@/db/mail-messages";
import { computeNextAttemptAt, MAX_SEND_ATTEMPTS } from "./retry-backoff";
import { createMailTransport, readMailSettings } from "./transport";

const DEFAULT_BATCH = 20;
/** Longer than one send can take (connection + greeting + socket timeouts), so a lease never runs out mid-send. */
const CLAIM_LEASE_MS = 10 * 60_000;
const SEND_TIMEOUT_MS = 60_000;

/**
 * Sends the messages of the outbox that are due. Each message is sent on its own; a failure counts an
 * attempt, sets the next try with backoff and is logged (console and audit trail), and never touches
 * the change that queued the message. Safe to run in several processes at once.
 * Without SMTP_HOST nothing is sent and messages keep waiting.
 */
export async function sendPendingMail(opts: { limit?: number; now?: Date } = {}): Promise<{ sent: number; failed: number }> {
  const settings = readMailSettings();
  if (!settings) return { sent: 0, failed: 0 };
  const clock = () => opts.now ?? new Date();
  const now = clock();
  const db = getDb();
  const due = await claimDueMail(db, {
    now,
    leaseUntil: new Date(now.getTime() + CLAIM_LEASE_MS),
    limit: opts.limit ?? DEFAULT_BATCH,
    maxAttempts: MAX_SEND_ATTEMPTS,
  });
  if (due.length === 0) return { sent: 0, failed: 0 };

  const transport = createMailTransport(settings);
  let sent = 0;
  let failed = 0;
  try {
    for (const message of due) {
      let smtpMessageId: string | null;
      try {
        const info = await transport.sendMail({
          from: settings.from,
          to: message.recipients,
          subject: message.subject,
          text: message.body,
          headers: { "X-Cellwright-Notice": message.kind },
          signal: AbortSignal.timeout(SEND_TIMEOUT_MS),
        });
        smtpMessageId = typeof info.messageId === "string" ? info.messageId : null;
      } catch (error) {
        failed++;
        await recordSendFailure(message, error, clock());
        continue;
      }
      sent++;
      // Sent but not marked (database gone): the lease runs out and it goes again. Twice beats never.
      await markMailSent(db, message.id, { at: clock(), smtpMessageId }).catch((error: unknown) =>
        console.error(`mail: message ${message.id} was sent but could not be marked as sent:`, error),
      );
    }
  } finally {
    transport.close();
  }
  return { sent, failed };
}

async function recordSendFailure(message: OutboxMessage, error: unknown, now: Date): Promise<void> {
  const attempts = message.attempts + 1;
  const nextAttemptAt = computeNextAttemptAt(attempts, now);
  const reason = describeSendError(error);
  console.error(
    `mail: sending "${message.subject}" (${message.id}) failed, attempt ${attempts} of ${MAX_SEND_ATTEMPTS}: ${reason}; ` +
      (nextAttemptAt ? `next try at ${nextAttemptAt.toISOString()}` : "giving up"),
  );
  try {
    await getDb()
      .transaction()
      .execute(async (tx) => {
        await markMailFailed(tx, message.id, { attempts, error: reason, nextAttemptAt });
        await recordAuditEvent(tx, {
          actorId: null,
          actorLabel: "mail sender",
          action: "mail.failed",
          entityType: "mail-message",
          entityId: message.id,
          detail: {
            kind: message.kind,
            subject: message.subject,
            attempt: attempts,
            error: reason,
            ...(nextAttemptAt ? { nextTry: nextAttemptAt.toISOString() } : { gaveUp: true }),
          },
        });
      });
  } catch (dbError) {
    // The lease runs out and the message is tried again; nothing is lost.
    console.error(`mail: could not record the failed attempt for ${message.id}:`, dbError);
  }
}

/** The server's or the network's reason in one line, e.g. "connect ECONNREFUSED 127.0.0.1:9 (ESOCKET)". */
export function describeSendError(error: unknown): string {
  if (!(error instanceof Error)) return String(error).slice(0, 500);
  const code = (error as { code?: unknown }).code;
  const text = error.message.replace(/\s+/g, " ").trim() || error.name;
  return (typeof code === "string" && !text.includes(code) ? `${text} (${code})` : text).slice(0, 500);
}
