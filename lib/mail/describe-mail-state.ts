import type { MailKind } from "@/db/schema";
import { MAX_SEND_ATTEMPTS } from "./retry-backoff";

export type MailState = "sent" | "waiting" | "retrying" | "gave-up";

export interface MailDelivery {
  sentAt: Date | null;
  attempts: number;
  nextAttemptAt: Date;
  lastError: string | null;
}

/** Where a message of the outbox stands. */
export function classifyMailState(m: MailDelivery): MailState {
  if (m.sentAt) return "sent";
  if (m.attempts >= MAX_SEND_ATTEMPTS) return "gave-up";
  return m.attempts === 0 ? "waiting" : "retrying";
}

/** The state in words, for the admin's e-mail page: "waiting, attempt 2 failed, next try at …". */
export function describeMailState(m: MailDelivery, formatMoment: (at: Date) => string): string {
  const state = classifyMailState(m);
  switch (state) {
    case "sent":
      return `sent at ${formatMoment(m.sentAt!)}`;
    case "waiting":
      return `waiting to be sent (first try at ${formatMoment(m.nextAttemptAt)})`;
    case "retrying":
      return `waiting: attempt ${m.attempts} of ${MAX_SEND_ATTEMPTS} failed, next try at ${formatMoment(m.nextAttemptAt)}`;
    case "gave-up":
      return `gave up after ${m.attempts} attempts`;
    default: {
      const never: never = state;
      return never;
    }
  }
}

/** Each kind of notice in words. */
export const MAIL_KIND_LABELS: Record<MailKind, string> = {
  "run-submitted": "run submitted",
  "run-returned": "run returned",
  "certificate-issued": "certificate issued",
  "calibration-due": "calibration due",
  "procedure-awaiting-release": "procedure waiting for release",
  "endurance-stop-reached": "endurance stop criterion met",
  "run-stalled": "test without new data",
};
