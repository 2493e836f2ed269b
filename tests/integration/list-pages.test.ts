import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listRunsPage } from "@/db/runs";
import { PAGE_SIZE, parseListParams } from "@/lib/lists/list-params";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser, releaseRatedCapacityProcedure } from "./fixtures";

const RUNS = 31;

async function planRuns() {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const other = await makeUser("operator", "Ola Other");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-LIST", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, "T-LIST");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-LIST", serial: "S-1", accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  // Identifiers in an order unlike the order the runs are planned in, so sorting by specimen is visible.
  const identifiers = Array.from({ length: RUNS }, (_, k) => `SP-${String((k * 7) % RUNS).padStart(2, "0")}`);
  for (const [k, identifier] of identifiers.entries()) {
    const specimen = (
      await getDb()
        .insertInto("specimen")
        .values({ identifier, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: engineer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
    await startRun(k % 4 === 0 ? other : operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, "2026-12-01");
  }
  return { operator, other, identifiers };
}

describe("a list of more than one page", () => {
  it("pages the runs 25 at a time in SQL, sorts them by a header's column, and keeps the filter", async () => {
    const { other, identifiers } = await planRuns();
    const bySpecimen = parseListParams({ sort: "specimen", dir: "asc", page: "1" }, { sorts: ["specimen", "planned"], defaultSort: "planned" });
    const first = await listRunsPage(getDb(), {}, { ...bySpecimen, pageSize: PAGE_SIZE });
    const second = await listRunsPage(getDb(), {}, { ...bySpecimen, page: 2, pageSize: PAGE_SIZE });
    expect(first).toMatchObject({ page: 1, pageCount: 2, total: RUNS });
    expect(first.rows).toHaveLength(25);
    expect(second.rows).toHaveLength(RUNS - 25);
    const sorted = [...identifiers].sort();
    expect([...first.rows, ...second.rows].map((r) => r.specimen.identifier)).toEqual(sorted);

    const descending = await listRunsPage(getDb(), {}, { page: 1, pageSize: PAGE_SIZE, sort: "specimen", direction: "desc" });
    expect(descending.rows.map((r) => r.specimen.identifier)).toEqual([...sorted].reverse().slice(0, 25));

    // A page past the end shows the last page rather than an empty list.
    const past = await listRunsPage(getDb(), {}, { page: 99, pageSize: PAGE_SIZE, sort: "specimen", direction: "asc" });
    expect(past.page).toBe(2);
    expect(past.rows.map((r) => r.id)).toEqual(second.rows.map((r) => r.id));

    // The filter narrows the count as well as the rows.
    const theirs = await listRunsPage(getDb(), { operatorId: other.id }, { page: 1, pageSize: PAGE_SIZE, sort: "planned", direction: "desc" });
    expect(theirs.total).toBe(Math.ceil(RUNS / 4));
    expect(theirs.pageCount).toBe(1);
    expect(new Set(theirs.rows.map((r) => r.operator.id))).toEqual(new Set([other.id]));

    const none = await listRunsPage(getDb(), { status: "accepted" }, { page: 3, pageSize: PAGE_SIZE, sort: "planned", direction: "desc" });
    expect(none).toMatchObject({ rows: [], total: 0, page: 1, pageCount: 1 });
  });
});
