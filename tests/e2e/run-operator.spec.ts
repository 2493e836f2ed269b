import { expect, test, type Page, type TestInfo } from "@playwright/test";
import pg from "pg";
import type { ProcedureResolution } from "../../protocols";
import { DEMO_CELL_SPECIFICATIONS, DEMO_USERS } from "@/scenarios/demo-lab";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";
import { signInAs } from "./fixtures";

/**
 * The operator's guard rails on the step sheet, at the desktop width and at the 768 px tablet by the
 * cycler: implausible and out-of-range readings, a struck reading, the caution before the start, a
 * channel whose range is too small, a submission without a log, and an abandoned run. Runs are
 * planned straight in the e2e database (a copy of the first seeded run: TPL-RC20 on a Korvel cell).
 */
const OPERATOR = DEMO_USERS.find((u) => u.role === "operator")!;
const WIDTHS = [1280, 768] as const;

async function withDb<T>(work: (db: pg.Client) => Promise<T>): Promise<T> {
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db.connect();
  try {
    return await work(db);
  } finally {
    await db.end();
  }
}

/** A planned run of TPL-RC20; `caution` gives its first step a caution; `ticked` records every step. */
async function planRun(opts: { caution?: boolean; ticked?: boolean } = {}): Promise<{ id: string; number: string; specimenId: string }> {
  return withDb(async (db) => {
    const source = await db.query(`select procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source from run order by number limit 1`);
    const row = source.rows[0];
    const resolution = row.resolution as ProcedureResolution;
    if (opts.caution) {
      const first = resolution.steps[0]!;
      resolution.cautions = [
        ...resolution.cautions,
        {
          severity: "caution",
          kind: "discharge-current-above-rating",
          code: `discharge-current-above-rating/${first.id}/current`,
          path: `steps.0.current`,
          stepId: first.id,
          message: `Step 1 “${first.label}” discharges above the cell's maximum continuous discharge current. Run it in the fire-safe enclosure and watch the cell's temperature.`,
          acknowledged: true,
        },
      ];
    }
    const created = await db.query(
      `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source)
       values ($1, $2, $3, $4, $5, $6) returning id, number`,
      [row.procedure_version_id, row.specimen_id, row.operator_id, JSON.stringify(resolution), JSON.stringify(row.cell_rating), JSON.stringify(row.procedure_source)],
    );
    const run = created.rows[0] as { id: string; number: string };
    if (opts.ticked) {
      const korvel = DEMO_CELL_SPECIFICATIONS.find((s) => s.model === "KV-21N48")!;
      const built = buildRatedCapacityRun({ cell: korvel.data, resolution, cellModel: { capacityMAh: 5050 }, sampleIntervalS: 30 });
      for (const r of built.input.stepRecords) {
        await db.query(`insert into step_record (run_id, step_id, cycle, record, completed, recorded_by) values ($1, $2, $3, $4, true, $5)`, [
          run.id,
          r.stepId,
          r.cycle ?? 1,
          JSON.stringify({ ambientReadings: [], programmed: {}, acknowledgedCautionCodes: [], ...r }),
          row.operator_id,
        ]);
      }
      await db.query(`update run set status = 'in_progress', started_at = now() where id = $1`, [run.id]);
    }
    return { ...run, specimenId: row.specimen_id };
  });
}

async function shoot(page: Page, testInfo: TestInfo, name: string): Promise<void> {
  await page.screenshot({ path: testInfo.outputPath(`${name}.png`), fullPage: true });
}

for (const width of WIDTHS) {
  test.describe(`at ${width} px`, () => {
    test.use({ viewport: { width, height: 900 } });

    test("a 500 °C reading is refused at once; 31 °C is warned and needs a note, which stays with the reading", async ({ page, context, baseURL }, testInfo) => {
      const run = await planRun();
      await signInAs(context, baseURL!, "operator");
      await page.goto(`/runs/${run.id}`);
      const first = page.getByTestId("step-line-precondition#1");
      await first.getByRole("button", { name: "Mark start" }).click();
      await expect(first.getByTestId("step-started-at")).toBeVisible();

      const form = first.getByTestId("current-step-form");
      await form.getByLabel("Reading (°C)").fill("500");
      await expect(form.getByTestId("reading-problem")).toContainText("500 °C cannot be an ambient temperature (readings lie between −60 °C and 150 °C)");
      await form.getByRole("button", { name: "Save the step" }).click();
      await expect(form.getByTestId("reading-problem")).toContainText("cannot be an ambient temperature");
      await expect(first.getByTestId("recorded-readings")).toHaveCount(0);
      await shoot(page, testInfo, `reading-500-refused-${width}`);

      await form.getByLabel("Reading (°C)").fill("31");
      const warning = form.getByTestId("reading-outside-range");
      await expect(warning).toContainText("31 °C is outside this step's range of 15 °C to 25 °C.");
      const note = warning.getByLabel("Note: what happened (required)");
      await expect(note).toHaveAttribute("required", "");
      await shoot(page, testInfo, `reading-31-warned-${width}`);
      await note.fill("climate chamber door left open while loading the cell");
      await form.getByRole("button", { name: "Save the step" }).click();
      await expect(first.getByTestId("recorded-readings")).toContainText("31 °C");
      await expect(first.getByTestId("recorded-readings")).toContainText("climate chamber door left open while loading the cell");
    });

    test("a struck reading stays visible, struck through, with who, when and why; the history keeps the correction", async ({ page, context, baseURL }, testInfo) => {
      const run = await planRun();
      await signInAs(context, baseURL!, "operator");
      await page.goto(`/runs/${run.id}`);
      const first = page.getByTestId("step-line-precondition#1");
      await first.getByRole("button", { name: "Mark start" }).click();
      await expect(first.getByTestId("step-started-at")).toBeVisible();
      const form = () => first.getByTestId("current-step-form");
      await form().getByLabel("Reading (°C)").fill("22");
      await form().getByRole("button", { name: "Save the step" }).click();
      await expect(first.getByTestId("recorded-readings")).toContainText("22 °C");
      await form().getByLabel("Reading (°C)").fill("31");
      await form().getByLabel("Note: what happened (required)").fill("reads high");
      await form().getByRole("button", { name: "Save the step" }).click();
      await expect(first.getByTestId("recorded-readings")).toContainText("31 °C");
      await first.getByRole("button", { name: "Mark end" }).click();
      await expect(first.getByTestId("step-ended-at")).toBeVisible();
      await form().getByLabel("Step carried out: tick it off").check();
      await form().getByRole("button", { name: "Save the step" }).click();
      await expect(first).toHaveAttribute("data-state", "done");

      const correct = first.getByTestId("correct-step");
      await correct.getByText("Correct this step…").click();
      await correct.getByRole("checkbox", { name: /^Strike 31 °C taken at/ }).check();
      await correct.getByLabel(/^Reason for the correction/).fill("31 °C was read off the chamber's display, not the thermometer");
      await correct.getByRole("button", { name: "Save the correction" }).click();
      await expect(first.getByTestId("struck-reading")).toHaveText("31 °C");
      await expect(first.getByTestId("recorded-ambient")).toContainText(`struck by ${OPERATOR.displayName}`);
      await expect(first.getByTestId("recorded-ambient")).toContainText("31 °C was read off the chamber's display, not the thermometer");
      // Still a counted reading beside it: the struck one is not erased, and not counted.
      await expect(first.getByTestId("recorded-ambient")).toContainText("22 °C");
      await shoot(page, testInfo, `reading-struck-${width}`);

      await page.getByRole("link", { name: "History" }).click();
      await expect(page.getByTestId("run-audit-trail")).toContainText("struck the reading 31 °C");
      await shoot(page, testInfo, `history-correction-${width}`);
    });

    test("a step with a caution starts only after the caution is acknowledged, and says by whom", async ({ page, context, baseURL }, testInfo) => {
      const run = await planRun({ caution: true });
      await signInAs(context, baseURL!, "operator");
      await page.goto(`/runs/${run.id}`);
      const first = page.getByTestId("step-line-precondition#1");
      const start = first.getByTestId("start-with-cautions");
      await expect(start).toContainText("Caution before you start");
      await start.getByRole("button", { name: "Mark start" }).click();
      await expect(start.getByRole("alert")).toHaveText("Read the caution of this step and tick “I have read this caution” before you start it.");
      await expect(first.getByTestId("step-started-at")).toHaveCount(0);
      await shoot(page, testInfo, `caution-before-start-${width}`);

      await start.getByLabel("I have read this caution").check();
      await start.getByRole("button", { name: "Mark start" }).click();
      await expect(first.getByTestId("step-started-at")).toBeVisible();
      await expect(first.getByTestId("caution-acknowledged")).toContainText(`Read and acknowledged by ${OPERATOR.displayName}`);
      await expect(first.getByTestId("caution-acknowledged")).toContainText("before the step started");
      await shoot(page, testInfo, `caution-acknowledged-${width}`);
    });

    test("a run is refused at planning on a cycler channel whose current range is below a set-point", async ({ page, context, baseURL }, testInfo) => {
      const channel = `CY9-CH0${width === 1280 ? 1 : 2}`;
      await withDb((db) =>
        db.query(
          `insert into instrument (kind, identifier, serial, accuracy, calibration_certificate, calibrated_on, due_on, created_by)
           select 'cycler-channel', $1, 'SN-E2E', $2, 'CAL-E2E', current_date - 30, current_date + 300, id from app_user where role = 'admin' limit 1
           on conflict do nothing`,
          [channel, JSON.stringify({ current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 0.5 } })],
        ),
      );
      await signInAs(context, baseURL!, "operator");
      await page.goto("/runs/new");
      const choose = async (label: string, text: string) => {
        const select = page.getByLabel(label);
        const value = await select.locator("option", { hasText: text }).first().getAttribute("value");
        await select.selectOption(value!);
      };
      await choose("Procedure version (released)", "TPL-RC20");
      await choose("Specimen", "KV48-2611-A-003");
      await page.getByRole("checkbox", { name: new RegExp(`cycler channel ${channel}`) }).check();
      await page.getByRole("button", { name: "Start the run" }).click();
      await expect(page.getByRole("alert").filter({ hasText: "cannot start on these instruments" })).toContainText(
        `above the 0.5 A current range of cycler channel ${channel}`,
      );
      await expect(page).toHaveURL(/\/runs\/new/);
      await shoot(page, testInfo, `range-refused-${width}`);
    });

    test("a run with every step ticked but no data log cannot be submitted", async ({ page, context, baseURL }, testInfo) => {
      const run = await planRun({ ticked: true });
      await signInAs(context, baseURL!, "operator");
      await page.goto(`/runs/${run.id}`);
      const submit = page.getByTestId("submit-run");
      await expect(submit.getByTestId("submit-problems")).toContainText("No data log is stored yet: upload the cycler's log on the Data log tab.");
      await submit.getByRole("button", { name: "Submit the run for review" }).click();
      await expect(submit.getByRole("alert")).toContainText(`Run ${run.number} cannot be submitted yet. No data log is stored yet`);
      await expect(page.getByTestId("run-status")).toHaveText(/in progress/);
      await shoot(page, testInfo, `submit-without-log-${width}`);
    });

    test("an abandoned run keeps its records, says why, takes no more records and is listed on its specimen's page", async ({ page, context, baseURL }, testInfo) => {
      const run = await planRun();
      await signInAs(context, baseURL!, "operator");
      await page.goto(`/runs/${run.id}`);
      const abandon = page.getByTestId("abandon-run");
      await abandon.getByText("Abandon this run…").click();
      await abandon.getByLabel("Why the run is abandoned").fill("cell vented on the channel before the first step");
      await abandon.getByRole("button", { name: "Abandon the run" }).click();
      await expect(page.getByTestId("run-status")).toHaveText(/abandoned/);
      await expect(page.getByTestId("abandoned-notice")).toContainText(`${OPERATOR.displayName} abandoned this run`);
      await expect(page.getByTestId("abandoned-notice")).toContainText("cell vented on the channel before the first step");
      await expect(page.getByRole("button", { name: "Mark start" })).toHaveCount(0);
      await shoot(page, testInfo, `abandoned-${width}`);

      await page.goto(`/specimens/${run.specimenId}`);
      const row = page.getByTestId("specimen-runs").getByRole("row", { name: new RegExp(run.number) });
      await expect(row).toContainText("abandoned");
      await expect(row).toContainText("cell vented on the channel before the first step");
      await shoot(page, testInfo, `specimen-runs-${width}`);
    });
  });
}
