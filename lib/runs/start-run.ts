import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCellSpecification } from "@/db/cell-specifications";
import { getProcedureVersionById } from "@/db/procedures";
import { insertRun, insertRunInstruments } from "@/db/runs";
import { getSpecimen } from "@/db/specimens";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { readCellRating } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";
import { lockInstrumentsForUse } from "@/db/instruments";
import { assertInstrumentsUsable } from "@/lib/instruments/assert-instruments-usable";
import { resolveProcedure } from "@/protocols";
import { findSetPointsOutsideRange } from "./check-instrument-ranges";

export const startRunSchema = z.object({
  procedureVersionId: z.uuid("Choose a released procedure version."),
  specimenId: z.uuid("Choose a specimen."),
  instrumentIds: z.array(z.uuid()).min(1, "Choose at least the cycler channel the run uses.").max(20),
});
export type StartRunInput = z.infer<typeof startRunSchema>;

/**
 * Plans a run: the released version resolved against the specimen's cell specification, frozen into
 * the run, on instruments that are active and within calibration. Refuses a procedure that cannot
 * run on this cell or whose cautions nobody acknowledged, and a set-point outside the range of a
 * chosen cycler channel (use a channel with a larger range).
 */
export async function startRun(actor: SignedInUser, input: StartRunInput, today: string): Promise<{ id: string; number: string }> {
  return getDb().transaction().execute(async (tx) => {
    const version = await getProcedureVersionById(tx, input.procedureVersionId);
    if (!version || version.status !== "released") throw new DomainError("conflict", "Only a released procedure version can be run.");
    const specimen = await getSpecimen(tx, input.specimenId);
    if (!specimen) throw new DomainError("not-found", "No such specimen.");
    const spec = await getCellSpecification(tx, specimen.specification.id);
    if (!spec) throw new DomainError("not-found", "The specimen's cell specification is missing.");
    await assertInstrumentsUsable(tx, input.instrumentIds, today);

    const resolved = resolveProcedure({ procedure: version.definition, cellSpecification: spec.data, acknowledgedCautions: version.acknowledgedCautions });
    if (!resolved.ok) throw new DomainError("invalid", "The procedure or the cell specification is not valid; open it and fix the problems shown there.");
    const { resolution } = resolved;
    if (resolution.errors.length > 0) {
      throw new DomainError("conflict", `This procedure cannot run on ${spec.maker} ${spec.model}: ${resolution.errors.map((e) => e.message).join("; ")}.`);
    }
    if (resolution.cautionsNeedingAcknowledgement.length > 0) {
      throw new DomainError("conflict", `A quality engineer must first acknowledge on the procedure: ${resolution.cautions.filter((c) => !c.acknowledged).map((c) => c.message).join("; ")}.`);
    }
    const outside = findSetPointsOutsideRange(resolution, await lockInstrumentsForUse(tx, input.instrumentIds));
    if (outside.length > 0) {
      throw new DomainError("conflict", `The run cannot start on these instruments: ${outside.join("; ")}. Choose a channel whose range covers every set-point.`);
    }
    const run = await insertRun(tx, {
      procedureVersionId: version.id,
      specimenId: specimen.id,
      operatorId: actor.id,
      resolution,
      cellRating: readCellRating(spec.data),
      procedureSource: { standard: version.definition.header.standard, clause: version.definition.header.clause },
    });
    await insertRunInstruments(tx, run.id, input.instrumentIds);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: "run.plan",
      entityType: "run",
      entityId: run.id,
      after: { number: run.number, procedure: `${version.code} version ${version.number}`, specimen: specimen.identifier, instruments: input.instrumentIds.length },
    });
    return run;
  });
}
