import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { formatLogCsv } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { acceptRun } from "@/lib/reviews/accept-run";
import { returnRun } from "@/lib/reviews/return-run";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { chunksOf, ELAPSED_LOG_MAPPING, makeUser, releaseRatedCapacityProcedure, setPassword } from "./fixtures";

// Issue 11 row 3: a second operator recorded the steps and uploaded the log of a run another operator
// started; later made engineer, they could accept and sign it. Anyone who took part is now refused,
// by the services and by the database.
const PASSWORD = "a passphrase long enough to sign";
let lab: { starter: SignedInUser; helper: SignedInUser; submitter: SignedInUser; reviewer: SignedInUser; versionId: string; channel: string; specId: string };

beforeAll(async () => {
  const reviewer = await setPassword(await makeUser("engineer", "Rosa Reviewer"), PASSWORD);
  const second = await makeUser("engineer", "Seb Second");
  const starter = await makeUser("operator", "Stan Starter");
  const helper = await setPassword(await makeUser("operator", "Hana Helper"), PASSWORD);
  const submitter = await setPassword(await makeUser("operator", "Sami Submitter"), PASSWORD);
  const specId = await createCellSpecification(reviewer, { maker: "Testmoor Cells", model: "TM-SOD", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(reviewer, second, "T-SOD");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-SOD", serial: "S-9", accuracy: JSON.stringify({}), calibration_certificate: "CAL-9", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  lab = { starter, helper, submitter, reviewer, versionId, channel, specId };
});

/** Started by one operator; every step recorded and the log uploaded by the helper; submitted by a third. */
async function sharedRun(tag: string) {
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-SOD-${tag}`, cell_specification_id: lab.specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(lab.starter, { procedureVersionId: lab.versionId, specimenId: specimen, instrumentIds: [lab.channel] }, "2026-12-01");
  const built = buildRatedCapacityRun({ sampleIntervalS: 10 });
  for (const record of built.input.stepRecords) await recordStep(lab.helper, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(lab.helper, run.id, { name: `${tag}.csv`, chunks: chunksOf(csv.value), mapping: ELAPSED_LOG_MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  await evaluateStoredRun(lab.helper, run.id, { columns: ingested.columns });
  await submitRun(lab.submitter, run.id);
  return run;
}

describe("separation of duties: nobody who took part in a run reviews or signs it", () => {
  it("refuses the operator who recorded the steps and uploaded the log, once made engineer", async () => {
    const run = await sharedRun("HELP");
    const promoted: SignedInUser = { ...lab.helper, role: "engineer" };
    await expect(acceptRun(promoted, run.id, { password: PASSWORD, acknowledgements: [] })).rejects.toThrow(
      /You took part in run R-\d+ \(you recorded its steps, uploaded its data log\)/,
    );
    await expect(returnRun(promoted, run.id, { comments: "fine" })).rejects.toThrow(/You took part in run/);
    const promotedSubmitter: SignedInUser = { ...lab.submitter, role: "engineer" };
    await expect(acceptRun(promotedSubmitter, run.id, { password: PASSWORD, acknowledgements: [] })).rejects.toThrow(/you submitted it/);

    // Past the services, straight into the tables: the database refuses each of them.
    for (const user of [lab.helper, lab.submitter]) {
      await expect(
        getDb().insertInto("run_review").values({ run_id: run.id, reviewer_id: user.id, decision: "returned", comments: "self-review" }).execute(),
      ).rejects.toThrow(/someone who took part in a run cannot review, sign or certify it/);
      await expect(
        getDb()
          .insertInto("electronic_signature")
          .values({ signer_id: user.id, printed_name: user.displayName, meaning: "reviewed", entity_type: "run", entity_id: run.id, record_sha256: "b".repeat(64) })
          .execute(),
      ).rejects.toThrow(/someone who took part in a run cannot review, sign or certify it/);
    }
    expect((await getDb().selectFrom("run_review").select("id").where("run_id", "=", run.id).execute()).length).toBe(0);

    // An engineer who took no part accepts it.
    const accepted = await acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: [] });
    expect(accepted.runNumber).toBe(run.number);
  });

  it("keeps the list of who took part: the database refuses to change or delete it", async () => {
    const run = await sharedRun("KEEP");
    const rows = await getDb().selectFrom("run_participant").select(["user_id", "activity"]).where("run_id", "=", run.id).orderBy("user_id").orderBy("activity").execute();
    expect(rows).toEqual([
      { user_id: lab.helper.id, activity: "recorded" },
      { user_id: lab.helper.id, activity: "uploaded" },
      { user_id: lab.submitter.id, activity: "submitted" },
      { user_id: lab.starter.id, activity: "started" },
    ]);
    await expect(getDb().deleteFrom("run_participant").where("run_id", "=", run.id).execute()).rejects.toThrow(/never changed or deleted/);
    await expect(getDb().updateTable("run_participant").set({ user_id: lab.reviewer.id }).where("run_id", "=", run.id).execute()).rejects.toThrow(/never changed or deleted/);
  });
});
