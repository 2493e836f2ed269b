import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { getRun, listStepRecords } from "@/db/runs";
import { createProcedure, releaseVersion, submitForReview } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { readSubmitReadiness } from "@/lib/runs/submit-readiness";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { observationBeforeAfterTemplate } from "@/protocols";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser } from "./fixtures";

const ALL_NONE_SEEN = ["leakage", "venting", "disassembly", "rupture", "fire"] as const;

describe("observation steps", () => {
  it("records observations without a data log, evaluates the criteria, reads them back and submits", async () => {
    const engineer = await makeUser("engineer", "Eli Engineer");
    const second = await makeUser("engineer", "Sol Second");
    const operator = await makeUser("operator", "Oda Operator");
    const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-OBS", data: inventedCell });
    const definition = structuredClone(observationBeforeAfterTemplate);
    definition.header.code = "T-OBS";
    const { versionId } = await createProcedure(engineer, procedureDraftSchema.parse({ definition }));
    await submitForReview(engineer, versionId);
    await releaseVersion(second, versionId);
    const specimen = (
      await getDb()
        .insertInto("specimen")
        .values({ identifier: "SP-OBS", cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: engineer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
    const balance = (
      await getDb()
        .insertInto("instrument")
        .values({ kind: "balance", identifier: "BAL-OBS", serial: "S-1", accuracy: JSON.stringify({ mass: { halfWidth: 0.001 } }), calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
    const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [balance] }, "2026-12-01");

    const ambient = (at: string) => [{ at, celsius: 21.5 }];
    const before = {
      stepId: "before",
      startedAt: "2026-12-01T08:00:00Z",
      endedAt: "2026-12-01T08:10:00Z",
      ambientReadings: ambient("2026-12-01T08:05:00Z"),
      observed: { massG: 45, openCircuitVoltageV: 3.6, dimensionsMm: { diameterOrThickness: 21.1, height: 70.2 }, visual: { noneSeen: [...ALL_NONE_SEEN] } },
      completed: true,
    };
    await recordStep(operator, run.id, before);
    await recordStep(operator, run.id, {
      stepId: "storage",
      startedAt: "2026-12-01T08:15:00Z",
      endedAt: "2026-12-02T08:20:00Z",
      ambientReadings: ambient("2026-12-01T20:00:00Z"),
      completed: true,
    });
    // 45 g → 44.91 g: a loss of exactly 0.2 %, the limit of the 1 g to 75 g band; 3.6 V → 3.24 V: exactly 90 %.
    await recordStep(operator, run.id, {
      stepId: "after",
      startedAt: "2026-12-02T08:25:00Z",
      endedAt: "2026-12-02T08:35:00Z",
      ambientReadings: ambient("2026-12-02T08:30:00Z"),
      observed: { massG: 44.91, openCircuitVoltageV: 3.24, visual: { noneSeen: ["leakage", "venting", "disassembly", "fire"] } },
      completed: true,
    });

    // Read back: the stored record holds the observation as sent.
    const stored = await listStepRecords(getDb(), run.id);
    expect(stored.find((r) => r.stepId === "before")?.observed).toEqual(before.observed);
    const raw = await getDb().selectFrom("step_record").select("record").where("run_id", "=", run.id).where("step_id", "=", "after").executeTakeFirstOrThrow();
    // jsonb keeps values, not key order: compared as values, with the list order kept.
    expect((raw.record as { observed: unknown }).observed).toStrictEqual({ massG: 44.91, openCircuitVoltageV: 3.24, visual: { noneSeen: ["leakage", "venting", "disassembly", "fire"] } });

    const readinessBefore = await readSubmitReadiness(getDb(), run.id);
    expect(readinessBefore.problems.join(" ")).not.toMatch(/data log/i);
    expect(readinessBefore.problems.join(" ")).toMatch(/not been evaluated/);

    const evaluation = await evaluateStoredRun(operator, run.id);
    const criteria = evaluation.observations?.criteria ?? [];
    expect(criteria.map((c) => [c.kind, c.outcome])).toEqual([
      ["mass loss", "conforms"],
      ["open-circuit voltage", "conforms"],
      ["visual state", "does not conform"],
    ]);
    expect(criteria[2]?.observed).toBe("not confirmed in the record: no rupture");
    expect(criteria[0]?.source).toBe("UN Manual of Tests and Criteria 38.3.4 (T1 to T5), criteria");
    expect(evaluation.verdict.specimenConforms).toBe("does not conform");
    // No step looks for a log phase, so nothing is left "not assessable" for want of a log.
    expect(evaluation.steps.flatMap((s) => s.findings).filter((f) => f.rule === "log-phase-found")).toEqual([]);
    expect(evaluation.runFindings.map((f) => f.rule)).not.toContain("no-unexplained-log-phase");

    // The evaluation as stored reads back with its observations.
    const row = await getDb().selectFrom("run_evaluation").select("evaluation").where("run_id", "=", run.id).executeTakeFirstOrThrow();
    expect((row.evaluation as typeof evaluation).observations).toEqual(evaluation.observations);

    expect((await readSubmitReadiness(getDb(), run.id)).problems).toEqual([]);
    await submitRun(operator, run.id);
    expect((await getRun(getDb(), run.id))?.status).toBe("submitted");
  });
});
