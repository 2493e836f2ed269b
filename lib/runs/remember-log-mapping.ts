import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { columnMappingSchema, type ColumnMapping } from "@/lib/analysis/log-import";
import type { SignedInUser } from "@/lib/auth/signed-in-user";

function cyclerChannelsOf(db: Executor, runId: string) {
  return db
    .selectFrom("run_instrument as ri")
    .innerJoin("instrument as i", "i.id", "ri.instrument_id")
    .select(["i.id", "i.identifier", "i.log_mapping"])
    .where("ri.run_id", "=", runId)
    .where("i.kind", "=", "cycler-channel")
    .orderBy("i.identifier");
}

/** The mapping last confirmed for the run's cycler channel, to offer again; null if none fits. */
export async function getRememberedLogMapping(runId: string): Promise<{ instrument: string; mapping: ColumnMapping } | null> {
  for (const r of await cyclerChannelsOf(getDb(), runId).execute()) {
    const parsed = columnMappingSchema.safeParse(r.log_mapping);
    if (parsed.success) return { instrument: r.identifier, mapping: parsed.data };
  }
  return null;
}

/** Keeps a confirmed mapping on each cycler channel the run uses, with an audit event per channel. */
export async function rememberLogMapping(actor: SignedInUser, runId: string, mapping: ColumnMapping): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const channels = await cyclerChannelsOf(getDb(), runId).execute();
    for (const c of channels) {
      await tx.updateTable("instrument").set({ log_mapping: JSON.stringify(mapping), updated_at: new Date() }).where("id", "=", c.id).execute();
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: `${actor.displayName} <${actor.email}>`,
        action: "instrument.edit",
        entityType: "instrument",
        entityId: c.id,
        before: { logMapping: c.log_mapping },
        after: { logMapping: mapping },
      });
    }
  });
}
