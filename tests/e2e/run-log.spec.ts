import { expect, test } from "@playwright/test";
import pg from "pg";
import { formatLogCsv } from "../../lib/analysis";
import type { ProcedureResolution } from "../../protocols";
import { DEMO_CELL_SPECIFICATIONS } from "@/scenarios/demo-lab";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";
import { signInAs } from "./fixtures";

/**
 * A run whose steps were recorded (written straight to the e2e database, as the step-sheet spec covers
 * the recording screens) gets its cycler log through the browser: columns mapped, the file sent, then
 * read by the worker while the page follows it (also after a reload), findings and plots after it; then
 * a log with time going backwards deep in the file is refused with its line, and the earlier log stays
 * the current one.
 */
test("an operator uploads a cycler log, sees it evaluated and plotted; a bad log is refused and changes nothing", async ({ page, context, baseURL }) => {
  // Two uploads and an evaluation: more than the default 30 s on a loaded 2-core machine.
  test.setTimeout(120_000);
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db.connect();
  let runId: string;
  let csv: string;
  try {
    const created = await db.query(
      `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source)
       select procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source from run order by number limit 1
       returning id, resolution, operator_id`,
    );
    runId = created.rows[0].id;
    const korvel = DEMO_CELL_SPECIFICATIONS.find((s) => s.model === "KV-21N48")!;
    // An invented cell that delivers a little more than its 4 850 mAh rating.
    const built = buildRatedCapacityRun({ cell: korvel.data, resolution: created.rows[0].resolution as ProcedureResolution, cellModel: { capacityMAh: 5050 }, sampleIntervalS: 5 });
    for (const r of built.input.stepRecords) {
      await db.query(`insert into step_record (run_id, step_id, cycle, record, completed, recorded_by) values ($1, $2, $3, $4, true, $5)`, [
        runId,
        r.stepId,
        r.cycle ?? 1,
        JSON.stringify({ ambientReadings: [], programmed: {}, acknowledgedCautionCodes: [], ...r }),
        created.rows[0].operator_id,
      ]);
    }
    await db.query(`update run set status = 'in_progress', started_at = now() where id = $1`, [runId]);
    const text = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current", "temperature"] });
    if (!text.ok) throw new Error(text.error.message);
    csv = text.value;
  } finally {
    await db.end();
  }

  await signInAs(context, baseURL!, "operator");
  await page.goto(`/runs/${runId}/log`);
  await page.getByLabel("CSV file from the cycler (up to 200 MiB)").setInputFiles({ name: "channel-01.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  await expect(page.getByTestId("mapping-preview")).toBeVisible();
  await page.getByRole("button", { name: /^Upload channel-01\.csv/ }).click();
  // The page follows the worker from the database: a reload (a closed tab) still shows the upload.
  await expect(page.getByTestId("log-reading")).toContainText("channel-01.csv", { timeout: 30_000 });
  await page.reload();
  const stored = page.getByRole("status").filter({ hasText: "Log stored" });
  await expect(stored).toContainText("Evaluated: The procedure was followed; the specimen conforms.", { timeout: 60_000 });
  // After "Log stored" the form does not invite a second upload: replacing is a deliberate choice.
  await expect(page.getByLabel("CSV file from the cycler (up to 200 MiB)")).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Replace the stored log…" })).toBeVisible();
  await expect(page.getByTestId("current-log")).toContainText("channel-01.csv");

  await page.getByRole("link", { name: "Findings and results" }).click();
  await expect(page.getByTestId("verdict")).toContainText("Procedure followedyes");
  await expect(page.getByTestId("verdict")).toContainText("Specimenconforms");
  // Findings come grouped by step; with nothing to look at every step is closed and its checks load on opening it.
  await expect(page.getByTestId("findings-summary")).toContainText(/^\d+ checks: \d+ meet/);
  const firstStep = page.getByTestId("finding-group").first();
  await expect(firstStep.getByRole("table")).toHaveCount(0);
  await firstStep.locator("summary").click();
  await expect(firstStep.getByRole("table")).toContainText("meets");
  await expect(page.getByTestId("time-plot").locator("canvas").first()).toBeVisible();
  await expect(page.getByTestId("capacity-plot").first()).toBeVisible();

  // Time going backwards on line 4 000, far past the part the browser checks before sending.
  const lines = csv.split("\n");
  [lines[3999], lines[4000]] = [lines[4000]!, lines[3999]!];
  await page.goto(`/runs/${runId}/log`);
  // A stored log closes the form: the page shows what is stored and offers replacing it deliberately.
  await expect(page.getByTestId("current-log")).toContainText("channel-01.csv");
  await expect(page.getByLabel("CSV file from the cycler (up to 200 MiB)")).toHaveCount(0);
  await page.getByRole("button", { name: "Replace the stored log…" }).click();
  await page.getByLabel("CSV file from the cycler (up to 200 MiB)").setInputFiles({ name: "channel-01-again.csv", mimeType: "text/csv", buffer: Buffer.from(lines.join("\n")) });
  await page.getByRole("button", { name: /^Upload channel-01-again\.csv/ }).click();
  const refused = page.getByRole("alert").filter({ hasText: "nothing of it was stored" });
  await expect(refused).toContainText(/Line 4001|line 4001/, { timeout: 60_000 });
  await expect(refused).toContainText("The run and its earlier records are as they were");
  await page.reload();
  await expect(page.getByTestId("current-log")).toContainText("channel-01.csv");
  await expect(page.getByTestId("current-log")).not.toContainText("channel-01-again.csv");
});
