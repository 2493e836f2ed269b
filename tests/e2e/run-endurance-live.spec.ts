import { spawn, type ChildProcess } from "node:child_process";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import pg from "pg";
import { DEMO_ENDURANCE_RUN, DEMO_USERS } from "@/scenarios/demo-lab";
import { enduranceLogPlan, formatEnduranceLogPart } from "@/scenarios/endurance-log";
import { signInAs } from "./fixtures";

const password = (email: string) => DEMO_USERS.find((u) => u.email === email)!.password;
const SPECIMEN = "HV30-LIVE-E2E";
/** An invented sample fading fast: 0.8 % of rated a cycle from 98 %, so the capacity check at cycle 50 gives 58.8 %, below TPL-END400's stop share of 60 %. */
const PLAN = { ...enduranceLogPlan, cycles: 50, sampleIntervalS: 30, fadePerCycle: 0.008, pulseEveryCycles: 50 };

async function query<T extends pg.QueryResultRow>(text: string, values: unknown[] = []): Promise<T[]> {
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db.connect();
  try {
    return (await db.query<T>(text, values)).rows;
  } finally {
    await db.end();
  }
}

interface CaughtMail {
  to: string[];
  subject: string;
  text: string;
}

async function readCatcher(): Promise<CaughtMail[]> {
  const res = await fetch(`${process.env.MAIL_CATCHER_URL}/messages`);
  return (await res.json()) as CaughtMail[];
}

/**
 * A second endurance run like the demo's (TPL-END400 on the invented 3 000 mAh cell, channel CY1-CH01),
 * with its precondition and the start of its cycle block recorded, and no log yet. Written straight to the
 * database: the step sheet has its own specs.
 */
async function startEnduranceRun(): Promise<{ id: string; number: string }> {
  const [demo] = await query<{ id: string }>(`select r.id from run r join specimen s on s.id = r.specimen_id where s.identifier = $1`, [DEMO_ENDURANCE_RUN.specimen]);
  const [specimen] = await query<{ id: string }>(
    `insert into specimen (identifier, cell_specification_id, received_on, condition_on_receipt, created_by)
     select $1, cell_specification_id, received_on, condition_on_receipt, created_by from specimen where identifier = $2 returning id`,
    [SPECIMEN, DEMO_ENDURANCE_RUN.specimen],
  );
  const [run] = await query<{ id: string; number: string }>(
    `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source, status, started_at)
     select procedure_version_id, $1, operator_id, resolution, cell_rating, procedure_source, 'in_progress', now() from run where id = $2
     returning id, number`,
    [specimen!.id, demo!.id],
  );
  await query(`insert into run_instrument (run_id, instrument_id) select $1, instrument_id from run_instrument where run_id = $2`, [run!.id, demo!.id]);
  await query(
    `insert into step_record (run_id, step_id, cycle, record, completed, recorded_by)
     select $1, step_id, cycle, record, completed, recorded_by from step_record where run_id = $2`,
    [run!.id, demo!.id],
  );
  return run!;
}

/** The run's accepted parts as the log page lists them, read again until there are `count`. */
async function expectParts(page: Page, runId: string, count: number): Promise<void> {
  await expect(async () => {
    await page.goto(`/runs/${runId}/log`);
    await expect(page.getByTestId("log-part")).toHaveCount(count, { timeout: 1_000 });
  }).toPass({ timeout: 60_000 });
}

/** How many cycles the run's per-cycle results hold (what the trend draws). */
async function countCycles(page: Page, runId: string): Promise<number> {
  const res = await page.request.get(`/api/runs/${runId}/cycles`);
  if (!res.ok()) return -1;
  const body = (await res.json()) as { rows?: unknown[] };
  return body.rows?.length ?? 0;
}

/**
 * Issue 16 end to end: an administrator issues a token for the run's cycler channel; the operator sends the
 * endurance run's first part from the log page (choosing its columns); the push command, started as on a
 * cycler PC, watches a folder and sends each further file the invented cycler writes; the parts list and the
 * capacity per cycle grow; a part overlapping the one before is refused in plain words and nothing of it is
 * kept; the capacity check below the stop share sends the stop e-mail; the accepted run's certificate lists
 * every part with its SHA-256.
 */
test("a live endurance run: token, first part in the browser, the push command, trend, overlap refused, stop e-mail, certificate lists the parts", async ({ browser, baseURL }) => {
  test.setTimeout(420_000);
  const run = await startEnduranceRun();
  const folder = await mkdtemp(path.join(tmpdir(), "cellwright-cycler-"));
  let pusher: ChildProcess | null = null;
  const pushed: string[] = [];
  try {
    // The administrator issues the channel's token; it is shown once.
    const adminContext = await browser.newContext();
    await signInAs(adminContext, baseURL!, "admin");
    const admin = await adminContext.newPage();
    await admin.goto("/admin/cycler-tokens");
    await expect(admin.getByText("Pushing a log never controls the cycler")).toBeVisible();
    const channel = admin.getByLabel("Cycler channel");
    await channel.selectOption((await channel.locator("option", { hasText: DEMO_ENDURANCE_RUN.channel }).getAttribute("value"))!);
    await admin.getByLabel("Label").fill("Cycler PC, bay 1 (live test)");
    await admin.getByRole("button", { name: "Issue token" }).click();
    const shown = admin.getByLabel("The new token");
    await expect(shown).toHaveValue(/^cwt_/);
    const token = await shown.inputValue();
    await adminContext.close();

    // The operator sends the first part from the run's log page, choosing how its columns are read.
    const operatorContext = await browser.newContext();
    await signInAs(operatorContext, baseURL!, "operator");
    const operator = await operatorContext.newPage();
    await operator.goto(`/runs/${run.id}/log`);
    await operator.waitForLoadState("networkidle");
    await operator.getByRole("radio", { name: "the first part of a log the cycler writes in parts" }).check();
    const first = formatEnduranceLogPart(PLAN, 1, 10);
    await operator.getByLabel("CSV file from the cycler (up to 200 MiB)").setInputFiles({ name: "live-part-01.csv", mimeType: "text/csv", buffer: Buffer.from(first) });
    await expect(operator.getByTestId("mapping-preview")).toBeVisible();
    await operator.getByRole("button", { name: /^Add live-part-01\.csv .* as a part$/ }).click();
    await expectParts(operator, run.id, 1);
    await expect.poll(() => countCycles(operator, run.id), { timeout: 30_000 }).toBe(10);

    // The push command, as the cycler PC runs it: the token from the environment, never on the command line.
    pusher = spawn("npx", ["tsx", "scripts/push-log.ts", "--watch", folder, "--url", baseURL!, "--run", run.number, "--settle", "1", "--interval", "1"], {
      env: { ...process.env, CELLWRIGHT_TOKEN: token },
      stdio: ["ignore", "pipe", "pipe"],
    });
    pusher.stdout!.on("data", (d: Buffer) => pushed.push(d.toString()));
    pusher.stderr!.on("data", (d: Buffer) => pushed.push(d.toString()));

    // The invented cycler writes its next file; the part and its cycles arrive without anyone clicking.
    const written = Date.now();
    await writeFile(path.join(folder, "live-part-02.csv"), formatEnduranceLogPart(PLAN, 11, 25));
    await expect.poll(() => countCycles(operator, run.id), { timeout: 90_000, intervals: [500] }).toBe(25);
    console.log(`part written to trend updated: ${((Date.now() - written) / 1000).toFixed(1)} s (settle 1 s, folder looked at every 1 s)`);
    await expectParts(operator, run.id, 2);
    await expect(operator.getByTestId("log-parts").getByTestId("log-part").nth(1)).toContainText("Cycler PC, bay 1 (live test)");

    // A file that starts inside the part before: refused when read, in plain words, and nothing of it kept.
    const filesBefore = await query<{ n: string }>(`select count(*) as n from stored_file where purpose = 'run-log'`);
    await writeFile(path.join(folder, "live-part-03.csv"), formatEnduranceLogPart(PLAN, 20, 30));
    await expect(async () => {
      await operator.goto(`/runs/${run.id}/log`);
      await expect(operator.getByTestId("log-reading")).toContainText("This part overlaps part 2", { timeout: 1_000 });
    }).toPass({ timeout: 60_000 });
    await expect(operator.getByTestId("log-reading")).toContainText("Send only the samples logged after the earlier part.");
    await expect(operator.getByTestId("log-part")).toHaveCount(2);
    expect(await query(`select 1 from run_log_part where run_id = $1 and part_number > 2`, [run.id])).toHaveLength(0);
    expect((await query<{ n: string }>(`select count(*) as n from stored_file where purpose = 'run-log'`))[0]!.n).toBe(filesBefore[0]!.n);
    expect(await countCycles(operator, run.id)).toBe(25);
    await operator.screenshot({ path: test.info().outputPath("log-page-overlap-refused.png"), fullPage: true });

    // The cycler goes on; at cycle 50 the capacity check is below 60 % of rated: the stop e-mail goes out.
    await writeFile(path.join(folder, "live-part-04.csv"), formatEnduranceLogPart(PLAN, 26, 40));
    await expectParts(operator, run.id, 3);
    await writeFile(path.join(folder, "live-part-05.csv"), formatEnduranceLogPart(PLAN, 41, 50));
    await expectParts(operator, run.id, 4);
    await expect.poll(() => countCycles(operator, run.id), { timeout: 60_000 }).toBe(50);
    const stopMail = await expect
      .poll(async () => (await readCatcher()).filter((m) => m.subject === `Run ${run.number}: stop criterion met at cycle 50`).length, { timeout: 30_000 })
      .toBe(1)
      .then(async () => (await readCatcher()).find((m) => m.subject === `Run ${run.number}: stop criterion met at cycle 50`)!);
    expect(stopMail.to).toContain("operator@brackwater.example");
    expect(stopMail.text).toContain("below the stop share of 60 %");

    await operator.goto(`/runs/${run.id}/results`);
    const trend = operator.getByTestId("cycle-trend");
    await expect(trend).toContainText("The latest 10 of 50 cycles");
    await expect(operator.getByTestId("cycle-table").locator("tbody tr").first()).toContainText("50");
    await operator.screenshot({ path: test.info().outputPath("results-live-trend.png"), fullPage: true });

    pusher.kill("SIGTERM");
    pusher = null;

    // The operator marks the end of the cycle block and submits; a second engineer accepts and issues the certificate.
    const [cycles] = await query<{ record: { startedAt: string } }>(`select record from step_record where run_id = $1 and step_id = 'cycles'`, [run.id]);
    await query(`update step_record set completed = true, record = record || jsonb_build_object('endedAt', $2::text, 'completed', true) where run_id = $1 and step_id = 'cycles'`, [
      run.id,
      new Date(Date.parse(cycles!.record.startedAt) + 630_000_000).toISOString(),
    ]);
    await operator.goto(`/runs/${run.id}`);
    // The invented log is no perfect run of the procedure (its cycles are not the template's): the operator submits with its deviations.
    await operator.getByRole("checkbox", { name: /I have read the \d+ deviations? on the Findings and results tab/ }).check();
    await operator.getByRole("button", { name: "Submit the run for review" }).click();
    await expect(operator.getByTestId("run-status")).toHaveText(/submitted for review/);

    const reviewerContext = await browser.newContext();
    await signInAs(reviewerContext, baseURL!, "engineer");
    const reviewer = await reviewerContext.newPage();
    await reviewer.goto(`/runs/${run.id}/review`);
    const notes = reviewer.getByLabel("Your note on this deviation");
    for (let i = 0; i < (await notes.count()); i++) await notes.nth(i).fill("Invented demo log of a live endurance test; recorded as found.");
    await reviewer.getByLabel("Your password, to sign").fill(password("engineer@brackwater.example"));
    await reviewer.getByRole("button", { name: `Sign as reviewed and accept run ${run.number}` }).click();
    await expect(reviewer.getByTestId("run-status")).toHaveText(/accepted/);
    await reviewer.getByLabel("Your password, to sign").fill(password("engineer@brackwater.example"));
    await reviewer.getByRole("button", { name: "Sign and issue the certificate" }).click();
    const issued = reviewer.getByRole("region", { name: "Certificate" }).getByRole("link", { name: /^C-\d{5}$/ });
    await expect(issued).toBeVisible({ timeout: 90_000 });
    const certificateNumber = (await issued.textContent())!.trim();

    await reviewer.goto("/certificates?spec=");
    await reviewer.getByRole("link", { name: certificateNumber }).click();
    const downloading = reviewer.waitForEvent("download");
    await reviewer.getByRole("link", { name: "Download the PDF" }).click();
    const pdfPath = test.info().outputPath(`${certificateNumber}.pdf`);
    await (await downloading).saveAs(pdfPath);
    const text = await pdfText(pdfPath);
    const parts = await query<{ number: number; sha256: string }>(`select part_number as number, sha256 from run_log_part where run_id = $1 order by part_number`, [run.id]);
    expect(parts).toHaveLength(4);
    const flat = text.replace(/\s+/g, "");
    for (const p of parts) expect(flat, `part ${p.number}'s SHA-256 on the certificate`).toContain(p.sha256);
    for (const name of ["live-part-01.csv", "live-part-02.csv", "live-part-04.csv", "live-part-05.csv"]) expect(text).toContain(name);
    expect(text).not.toContain("live-part-03.csv");
  } finally {
    if (pusher) pusher.kill("SIGTERM");
    await test.info().attach("push-log output", { body: pushed.join("") });
    await rm(folder, { recursive: true, force: true });
  }
});

/** The certificate's text as poppler's pdftotext reads it (Debian's poppler-utils, as pdfsig in other specs). */
async function pdfText(file: string): Promise<string> {
  const out = `${file}.txt`;
  await new Promise<void>((resolve, reject) => {
    const p = spawn("pdftotext", ["-layout", file, out], { stdio: "ignore" });
    p.on("error", reject);
    p.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`pdftotext exited ${code}`))));
  });
  return readFile(out, "utf8");
}
