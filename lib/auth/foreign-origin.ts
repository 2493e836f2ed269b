import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";

/** A refused cross-site write is a security event: it goes to the audit trail, best effort. */
export async function recordForeignOrigin(e: { method: string; path: string; origin: string | null; host: string | null }) {
  try {
    await recordAuditEvent(getDb(), {
      actorId: null,
      actorLabel: "unknown caller",
      action: "security.foreign-origin-refused",
      detail: e,
    });
  } catch (error) {
    console.error("could not record a refused foreign-origin request", error);
  }
}
