import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { findRunByNumber, listRunInstrumentIds } from "@/db/runs";
import type { RunStatus } from "@/db/schema";
import { DomainError } from "@/lib/errors";
import { isRunOpen, RUN_STATUS_WORDS } from "@/lib/runs/run-status";
import { machineActorLabel, type MachineCaller } from "./authenticate-machine-token";
import { tokenCoversRun } from "./token-policy";

export interface PushedPart {
  name: string;
  chunks: AsyncIterable<Uint8Array>;
  sizeBytes: number;
}

export type MachineSender = { kind: "machine"; tokenId: string; label: string };
export type PartOutcome = { outcome: "queued"; partId: string; jobId: string } | { outcome: "already-stored"; partId: string };
/** lib/runs/log-parts/append-log-part.ts: appends one part to a run's log, or refuses with a DomainError. */
export type AppendPart = (sender: MachineSender, runId: string, part: PushedPart) => Promise<PartOutcome>;

/**
 * One log part pushed by a cycler PC: the run must exist, list the token's channel among its instruments,
 * and still be open; the part must not be empty. These refusals are audited here with the token as the one
 * who acted, and store nothing. Then the part is appended: the log-parts service refuses (and audits) what
 * it finds wrong itself, and its reader checks overlaps and the column layout against the earlier parts.
 */
export async function pushLogPart(caller: MachineCaller, runNumber: string, part: PushedPart, append: AppendPart): Promise<PartOutcome & { run: string }> {
  const run = await findRunByNumber(getDb(), runNumber);
  const refusal = await refusePush(caller, run, runNumber, part);
  if (refusal) {
    await auditPartRefusal(caller, run, part.name, refusal);
    throw refusal;
  }
  const outcome = await append({ kind: "machine", tokenId: caller.tokenId, label: machineActorLabel(caller) }, run!.id, part);
  return { ...outcome, run: run!.number };
}

async function refusePush(caller: MachineCaller, run: { id: string; number: string; status: RunStatus } | null, runNumber: string, part: PushedPart): Promise<DomainError | null> {
  if (!run) return new DomainError("not-found", `There is no run ${runNumber}. Check the run number given to the push command.`);
  if (!tokenCoversRun(caller.instrumentId, await listRunInstrumentIds(getDb(), run.id))) {
    return new DomainError("forbidden", `This token is for ${caller.channel}, which run ${run.number} does not use. Use the token of the run's cycler channel.`);
  }
  if (!isRunOpen(run.status)) return new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}; its log can no longer change. Nothing was stored.`);
  if (part.sizeBytes === 0) return new DomainError("invalid", `The part "${part.name}" is empty (0 bytes). Nothing was stored.`);
  return null;
}

async function auditPartRefusal(caller: MachineCaller, run: { id: string; number: string } | null, name: string, error: DomainError): Promise<void> {
  await recordAuditEvent(getDb(), {
    actorId: null,
    actorLabel: machineActorLabel(caller),
    action: "machine-token.part-refused",
    entityType: run ? "run" : "instrument",
    entityId: run ? run.id : caller.instrumentId,
    detail: { tokenId: caller.tokenId, run: run?.number ?? null, file: name.slice(0, 200), reason: error.message },
    address: caller.address,
  });
}
