import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listRunsInStates } from "@/db/queues";
import { listReviewQueue } from "@/db/reviews";
import { listRunsPage } from "@/db/runs";
import { PAGE_SIZE } from "@/lib/lists/list-params";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { withOwnerClient } from "../support/test-database";
import { makeUser, releaseRatedCapacityProcedure } from "./fixtures";

// The home page's queues used to stop at 100 (runs) and 200 (review) rows without saying so, and a
// specimen's runs at 200: each now pages, so the rows past the old cap are one page away.
const SUBMITTED = 210;
const RETURNED = 110;

async function runsInQueues() {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-QUEUE", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, "T-QUEUE");
  const specimenId = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: "SP-QUEUE", cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-QUEUE", serial: "S-1", accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const model = await startRun(operator, { procedureVersionId: versionId, specimenId, instrumentIds: [channel] }, "2026-12-01");
  // Copies of the started run in bulk (startRun for each would take minutes): submitted ones, a second
  // apart, and returned ones, each changed a second after the one before, so the order is known.
  await withOwnerClient(async (c) => {
    const copy = (status: string, count: number, stamp: string) =>
      c.query(
        `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source, status, submitted_at, updated_at)
         select procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source, $2,
                timestamptz '2026-12-02' + g * interval '1 second', ${stamp} + g * interval '1 second'
         from run, generate_series(1, $3::int) g where id = $1`,
        [model.id, status, count],
      );
    await copy("submitted", SUBMITTED, "timestamptz '2026-12-02'");
    await copy("returned", RETURNED, "timestamptz '2026-12-03'");
  });
  return { engineer, operator, specimenId };
}

describe("the queues page instead of stopping at a cap", () => {
  it("reaches the review queue's rows past 200, the returned runs past 100 and a specimen's runs past 200", async () => {
    const { engineer, operator, specimenId } = await runsInQueues();

    const review = await listReviewQueue(getDb(), engineer.id, { page: 1, pageSize: PAGE_SIZE });
    expect(review).toMatchObject({ total: SUBMITTED, pageCount: Math.ceil(SUBMITTED / PAGE_SIZE), page: 1 });
    const lastReview = await listReviewQueue(getDb(), engineer.id, { page: review.pageCount, pageSize: PAGE_SIZE });
    expect(lastReview.rows).toHaveLength(SUBMITTED - (review.pageCount - 1) * PAGE_SIZE);
    // The longest-waiting first: the last page ends with the latest submitted, the 210th, past the old 200.
    const submittedTimes = lastReview.rows.map((r) => r.submittedAt!.getTime());
    expect(submittedTimes).toEqual([...submittedTimes].sort((a, b) => a - b));
    expect(lastReview.rows.at(-1)!.submittedAt).toEqual(new Date(Date.parse("2026-12-02T00:00:00Z") + SUBMITTED * 1000));

    const returned = { statuses: ["returned"] as const, operatorId: operator.id };
    const fifth = await listRunsInStates(getDb(), returned, { page: 5, pageSize: PAGE_SIZE });
    expect(fifth).toMatchObject({ total: RETURNED, pageCount: 5, page: 5 });
    expect(fifth.rows).toHaveLength(RETURNED - 4 * PAGE_SIZE);
    const pages = await Promise.all([1, 2, 3, 4, 5].map((page) => listRunsInStates(getDb(), returned, { page, pageSize: PAGE_SIZE })));
    const ids = pages.flatMap((p) => p.rows.map((r) => r.runId));
    expect(new Set(ids).size).toBe(RETURNED);
    expect(pages.flatMap((p) => p.rows.map((r) => r.status))).toEqual(Array(RETURNED).fill("returned"));

    // Another operator's queue holds none of them; the open-runs queue holds only the one still planned.
    const open = await listRunsInStates(getDb(), { statuses: ["planned", "in_progress"], operatorId: operator.id }, { page: 1, pageSize: PAGE_SIZE });
    expect(open.total).toBe(1);

    const specimenRuns = await listRunsPage(getDb(), { specimenId }, { page: 13, pageSize: PAGE_SIZE, sort: "planned", direction: "desc" });
    expect(specimenRuns).toMatchObject({ total: 1 + SUBMITTED + RETURNED, pageCount: 13, page: 13 });
    expect(specimenRuns.rows).toHaveLength(1 + SUBMITTED + RETURNED - 12 * PAGE_SIZE);
  });
});
