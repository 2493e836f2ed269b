import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { translateConstraintError } from "@/db/constraint-errors";
import { listAuditEvents } from "@/db/audit";
import { getProcedureVersion, listProcedureVersions } from "@/db/procedures";
import { createProcedure, releaseVersion, saveDraft, startNewDraft, submitForReview, withdrawVersion } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { compareProcedures, ratedCapacityAt20cTemplate } from "@/protocols";
import { makeUser } from "./fixtures";
import { withOwnerClient } from "../support/test-database";

function draftOf(code: string) {
  const definition = structuredClone(ratedCapacityAt20cTemplate);
  definition.header.code = code;
  return procedureDraftSchema.parse({ definition });
}

async function releasedProcedure(code: string) {
  const author = await makeUser("engineer", "Ada Author");
  const second = await makeUser("engineer", "Sam Second");
  const { procedureId, versionId } = await createProcedure(author, draftOf(code));
  await submitForReview(author, versionId);
  await releaseVersion(second, versionId);
  return { author, second, procedureId, versionId };
}

describe("procedure versions", () => {
  it("needs a second engineer to release: the author is refused, by the service and by the database", async () => {
    const author = await makeUser("engineer", "Ada Author");
    const { versionId } = await createProcedure(author, draftOf("T-RC-1"));
    await submitForReview(author, versionId);
    await expect(releaseVersion(author, versionId)).rejects.toThrow(/second engineer/);
    // Bypassing the service: the check constraint still refuses.
    await expect(
      sql`update procedure_version set status = 'released', released_by = author_id, released_at = now() where id = ${versionId}`.execute(getDb()),
    ).rejects.toThrow(/procedure_version_second_engineer/);
    const v = await getDb().selectFrom("procedure_version").select("status").where("id", "=", versionId).executeTakeFirstOrThrow();
    expect(v.status).toBe("in_review");
  });

  it("freezes a released version: the service and a direct UPDATE or DELETE are refused", async () => {
    const { author, versionId } = await releasedProcedure("T-RC-2");
    await expect(saveDraft(author, versionId, draftOf("T-RC-2"))).rejects.toThrow(/only a draft can be edited/);
    await expect(sql`update procedure_version set title = 'tampered' where id = ${versionId}`.execute(getDb())).rejects.toThrow(/released and frozen/);
    await expect(
      sql`update procedure_version set definition = jsonb_set(definition, '{steps,0,label}', '"x"') where id = ${versionId}`.execute(getDb()),
    ).rejects.toThrow(/released and frozen/);
    await expect(sql`delete from procedure_version where id = ${versionId}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await withOwnerClient((owner) => expect(owner.query(`delete from procedure_version where id = $1`, [versionId])).rejects.toThrow(/only drafts can be deleted/));
    const v = await getDb().selectFrom("procedure_version").select(["title", "status"]).where("id", "=", versionId).executeTakeFirstOrThrow();
    expect(v).toEqual({ title: "Rated capacity at 20 °C", status: "released" });
  });

  it("lets a released version be withdrawn with a reason, after which it is frozen too", async () => {
    const { second, versionId } = await releasedProcedure("T-RC-3");
    await withdrawVersion(second, versionId, "clause replaced by the 2024 edition");
    await expect(sql`update procedure_version set withdrawal_reason = 'other' where id = ${versionId}`.execute(getDb())).rejects.toThrow(/withdrawn and frozen/);
  });

  it("edits a released procedure through a new draft, and the comparison shows what changed", async () => {
    const { author, second, procedureId, versionId } = await releasedProcedure("T-RC-4");
    const { versionId: v2, number } = await startNewDraft(author, versionId);
    expect(number).toBe(2);
    const changed = draftOf("T-RC-4");
    const rest = changed.definition.steps.find((s) => s.id === "rest");
    if (rest?.kind !== "rest") throw new Error("template changed: no rest step");
    rest.minDuration = { value: 2, unit: "h" };
    changed.definition.steps.push({ kind: "rest", id: "rest-after", label: "Rest after discharge", minDuration: { value: 1, unit: "h" } });
    await saveDraft(author, v2, changed);
    await submitForReview(author, v2);
    await releaseVersion(second, v2);

    const versions = await listProcedureVersions(getDb(), procedureId);
    expect(versions.map((v) => [v.number, v.status])).toEqual([
      [2, "released"],
      [1, "withdrawn"],
    ]);
    const [one, two] = await Promise.all([getProcedureVersion(getDb(), procedureId, 1), getProcedureVersion(getDb(), procedureId, 2)]);
    const cmp = compareProcedures(one!.definition, two!.definition);
    expect(cmp.steps.find((s) => s.stepId === "rest")).toMatchObject({ change: "changed", changedFields: ["minDuration.value"] });
    expect(cmp.steps.find((s) => s.stepId === "rest-after")?.change).toBe("added");
    expect(cmp.steps.find((s) => s.stepId === "discharge")?.change).toBe("unchanged");

    const actions = (await listAuditEvents(getDb(), { entityType: "procedure-version" })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["procedure.create", "procedure.submit", "procedure.release", "procedure.new-draft", "procedure.save-draft", "procedure.withdraw"]));
  });

  it("refuses an invalid step list with field paths and saves nothing", async () => {
    const author = await makeUser("engineer", "Ada Author");
    const bad = structuredClone(ratedCapacityAt20cTemplate);
    bad.header.code = "T-BAD";
    const rest = bad.steps.find((s) => s.kind === "rest");
    if (rest?.kind === "rest") rest.maxDuration = { value: 10, unit: "min" };
    const parsed = procedureDraftSchema.safeParse({ definition: { ...bad, steps: bad.steps } });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain("definition.steps.2.maxDuration");
    const empty = procedureDraftSchema.safeParse({ definition: { ...bad, steps: [] } });
    expect(empty.error?.issues.map((i) => i.path.join("."))).toContain("definition.steps");
    const saved = await getDb().selectFrom("procedure").select("id").where("code", "=", "T-BAD").execute();
    expect(saved).toEqual([]);
    expect(author.role).toBe("engineer");
  });

  it("keeps one open draft per procedure", async () => {
    const { author, versionId } = await releasedProcedure("T-RC-5");
    await startNewDraft(author, versionId);
    const second = await startNewDraft(author, versionId).catch((e: unknown) => e);
    // The database refuses a second open version; the edges turn that into a plain message.
    expect(translateConstraintError(second)?.message).toMatch(/already has an open draft or review/);
  });
});
