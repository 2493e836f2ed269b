import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";

/** Where a change came from, as the request's headers gave it: read once per server action. */
export interface AuditContext {
  /** The client address (first x-forwarded-for entry, else x-real-ip), or "unknown". */
  address: string;
  /** The browser's user-agent header, if it sent one. */
  client?: string;
}

const storage = new AsyncLocalStorage<AuditContext>();

/** Runs `work` with an audit context that recordAuditEvent fills into every event it writes. */
export function runWithAuditContext<T>(context: AuditContext, work: () => Promise<T>): Promise<T> {
  return storage.run(context, work);
}

/** The audit context of the server action being run, if any. */
export function currentAuditContext(): AuditContext | undefined {
  return storage.getStore();
}
