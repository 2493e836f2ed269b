import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { endSession, type CurrentSession } from "./session";

export async function signOut(session: CurrentSession, address: string): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    await endSession(tx, session.sessionId);
    await recordAuditEvent(tx, {
      actorId: session.user.id,
      actorLabel: `${session.user.displayName} <${session.user.email}>`,
      action: "auth.sign-out",
      entityType: "user",
      entityId: session.user.id,
      address,
    });
  });
}
