import "server-only";
import { sql } from "kysely";
import type { MailKind } from "./schema";
import type { Executor } from "./index";

/** A message of the outbox as the sender and the admin's page see it. */
export interface OutboxMessage {
  id: string;
  kind: MailKind;
  recipients: string[];
  subject: string;
  body: string;
  createdAt: Date;
  attempts: number;
  nextAttemptAt: Date;
  sentAt: Date | null;
  lastError: string | null;
  smtpMessageId: string | null;
}

const COLUMNS = [
  "id",
  "kind",
  "recipients",
  "subject",
  "body",
  "created_at",
  "attempts",
  "next_attempt_at",
  "sent_at",
  "last_error",
  "smtp_message_id",
] as const;

type Row = {
  id: string;
  kind: MailKind;
  recipients: string[];
  subject: string;
  body: string;
  created_at: Date;
  attempts: number;
  next_attempt_at: Date;
  sent_at: Date | null;
  last_error: string | null;
  smtp_message_id: string | null;
};

function toMessage(r: Row): OutboxMessage {
  return {
    id: r.id,
    kind: r.kind,
    recipients: r.recipients,
    subject: r.subject,
    body: r.body,
    createdAt: r.created_at,
    attempts: r.attempts,
    nextAttemptAt: r.next_attempt_at,
    sentAt: r.sent_at,
    lastError: r.last_error,
    smtpMessageId: r.smtp_message_id,
  };
}

/**
 * Takes up to `limit` messages that are due, for one sender: their next try moves to `leaseUntil`,
 * so no other process takes them meanwhile (SKIP LOCKED lets several senders run side by side).
 * A sender that dies mid-way leaves them to be taken again once the lease has run out.
 */
export async function claimDueMail(db: Executor, opts: { now: Date; leaseUntil: Date; limit: number; maxAttempts: number }): Promise<OutboxMessage[]> {
  const rows = await db
    .updateTable("mail_message")
    .set({ next_attempt_at: opts.leaseUntil })
    .where("id", "in", (eb) =>
      eb
        .selectFrom("mail_message")
        .select("id")
        .where("sent_at", "is", null)
        .where("attempts", "<", opts.maxAttempts)
        .where("next_attempt_at", "<=", opts.now)
        .orderBy("next_attempt_at")
        .orderBy("created_at")
        .limit(opts.limit)
        .forUpdate()
        .skipLocked(),
    )
    .returning(COLUMNS)
    .execute();
  return rows.map(toMessage).sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
}

export async function markMailSent(db: Executor, id: string, sent: { at: Date; smtpMessageId: string | null }): Promise<void> {
  await db
    .updateTable("mail_message")
    .set({ sent_at: sent.at, smtp_message_id: sent.smtpMessageId, last_error: null })
    .where("id", "=", id)
    .where("sent_at", "is", null)
    .execute();
}

/** Counts one more failed attempt; `nextAttemptAt` null means the sender gives up on it. */
export async function markMailFailed(db: Executor, id: string, failure: { attempts: number; error: string; nextAttemptAt: Date | null }): Promise<void> {
  await db
    .updateTable("mail_message")
    .set({ attempts: failure.attempts, last_error: failure.error, ...(failure.nextAttemptAt ? { next_attempt_at: failure.nextAttemptAt } : {}) })
    .where("id", "=", id)
    .where("sent_at", "is", null)
    .execute();
}

/** The outbox, newest first. */
export async function listOutbox(db: Executor, opts: { limit?: number } = {}): Promise<OutboxMessage[]> {
  const rows = await db
    .selectFrom("mail_message")
    .select(COLUMNS)
    .orderBy("created_at", "desc")
    .orderBy("id")
    .limit(opts.limit ?? 100)
    .execute();
  return rows.map(toMessage);
}

export interface OutboxCounts {
  sent: number;
  waiting: number;
  gaveUp: number;
}

export async function countOutbox(db: Executor, maxAttempts: number): Promise<OutboxCounts> {
  const r = await db
    .selectFrom("mail_message")
    .select([
      sql<number>`count(*) filter (where sent_at is not null)::int`.as("sent"),
      sql<number>`count(*) filter (where sent_at is null and attempts < ${maxAttempts})::int`.as("waiting"),
      sql<number>`count(*) filter (where sent_at is null and attempts >= ${maxAttempts})::int`.as("gave_up"),
    ])
    .executeTakeFirstOrThrow();
  return { sent: r.sent, waiting: r.waiting, gaveUp: r.gave_up };
}
