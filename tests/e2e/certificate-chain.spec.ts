import { expect, test, type Browser, type Page } from "@playwright/test";
import pg from "pg";
import { formatLogCsv } from "../../lib/analysis";
import type { ProcedureResolution } from "../../protocols";
import { DEMO_CELL_SPECIFICATIONS, DEMO_USERS } from "@/scenarios/demo-lab";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";
import { signInAs, signInAsUser } from "./fixtures";

const password = (email: string) => DEMO_USERS.find((u) => u.email === email)!.password;

async function asRole(browser: Browser, baseURL: string, role: "engineer" | "operator" | "auditor"): Promise<Page> {
  const context = await browser.newContext({ acceptDownloads: true });
  await signInAs(context, baseURL, role);
  return context.newPage();
}

async function chooseOption(select: import("@playwright/test").Locator, text: string): Promise<void> {
  const value = await select.locator("option", { hasText: text }).first().getAttribute("value");
  expect(value, `an option containing "${text}"`).toBeTruthy();
  await select.selectOption(value!);
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
 * The whole chain, one person after another: an engineer writes a procedure and a second engineer
 * releases it; an operator starts a run of it, uploads the cycler's log and submits it; the second
 * engineer, who did not operate it, accepts and signs it and issues the certificate; an auditor
 * downloads the PDF and checks it on the public page, where a changed copy is caught; the notices
 * arrive at the local mail catcher. The step records are written straight to the database, as the
 * step-sheet spec covers that screen.
 */
test("procedure → run → review → signed certificate → public check, with the e-mails", async ({ browser, baseURL }) => {
  test.setTimeout(240_000);
  const code = `CH-RC20-${Date.now() % 100000}`;

  // An engineer drafts from the template and submits it; a second engineer releases it.
  const author = await asRole(browser, baseURL!, "engineer");
  await author.goto("/procedures/new");
  await author.getByRole("radio", { name: "Rated capacity at 20 °C" }).check();
  await author.getByLabel("Code of the new procedure").fill(code);
  await author.getByRole("button", { name: "Create draft" }).click();
  await expect(author).toHaveURL(/\/procedures\/[0-9a-f-]+\/versions\/1\/edit$/);
  const procedureUrl = author.url().replace(/\/versions\/1\/edit$/, "");
  await author.goto(procedureUrl);
  await author.getByRole("button", { name: "Submit for review" }).click();
  await expect(author.getByTestId("version-1")).toContainText("Submitted for review");

  // The second engineer of the demo lab: the author may not release their own version.
  const releaserContext = await browser.newContext();
  await signInAsUser(releaserContext, baseURL!, "engineer2@brackwater.example");
  const reviewer = await releaserContext.newPage();
  await reviewer.goto(procedureUrl);
  // Releasing is a signature: the release page, then the password again.
  await reviewer.getByRole("link", { name: "Release version 1" }).click();
  await reviewer.getByLabel("Your password, to sign").fill(password("engineer2@brackwater.example"));
  await reviewer.getByRole("button", { name: "Sign and release version 1" }).click();
  await expect(reviewer.getByTestId("signature-manifestation")).toContainText("Released by Tomas Lindqvist");
  await reviewer.goto(procedureUrl);
  await expect(reviewer.getByTestId("version-1")).toContainText("Released by");

  // A loose specimen of the invented 4 850 mAh cell for this run alone.
  const specimen = `KV-CHAIN-${Date.now() % 100000}`;
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db.connect();
  try {
    await db.query(
      `insert into specimen (identifier, cell_specification_id, received_on, condition_on_receipt, created_by)
       select $1, s.id, current_date, 'as received, no marks', u.id from cell_specification s, app_user u
       where s.model = 'KV-21N48' and u.email = 'operator@brackwater.example'`,
      [specimen],
    );
  } finally {
    await db.end();
  }

  // The operator starts the run from the released version.
  const operator = await asRole(browser, baseURL!, "operator");
  await operator.goto("/runs/new");
  await chooseOption(operator.getByLabel("Procedure version (released)"), code);
  await chooseOption(operator.getByLabel("Specimen"), specimen);
  await operator.getByRole("checkbox", { name: /cycler channel CY1-CH01/ }).check();
  await operator.getByRole("checkbox", { name: /^(thermometer|climate chamber) / }).first().check();
  await operator.getByRole("button", { name: "Start the run" }).click();
  await expect(operator).toHaveURL(/\/runs\/[0-9a-f-]+$/);
  const runId = operator.url().split("/").pop()!;

  const db2 = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db2.connect();
  let csv: string;
  let runNumber: string;
  try {
    const run = await db2.query(`select number, resolution, operator_id from run where id = $1`, [runId]);
    runNumber = run.rows[0].number;
    const korvel = DEMO_CELL_SPECIFICATIONS.find((s) => s.model === "KV-21N48")!;
    const built = buildRatedCapacityRun({ cell: korvel.data, resolution: run.rows[0].resolution as ProcedureResolution, cellModel: { capacityMAh: 5050 }, sampleIntervalS: 5 });
    for (const r of built.input.stepRecords) {
      await db2.query(`insert into step_record (run_id, step_id, cycle, record, completed, recorded_by) values ($1, $2, $3, $4, true, $5)`, [
        runId,
        r.stepId,
        r.cycle ?? 1,
        JSON.stringify({ ambientReadings: [], programmed: {}, acknowledgedCautionCodes: [], ...r }),
        run.rows[0].operator_id,
      ]);
    }
    await db2.query(`update run set status = 'in_progress', started_at = now() where id = $1`, [runId]);
    const text = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current", "temperature"] });
    if (!text.ok) throw new Error(text.error.message);
    csv = text.value;
  } finally {
    await db2.end();
  }

  await operator.goto(`/runs/${runId}/log`);
  // The file box is a client component: choose the file only once the page is interactive.
  await operator.waitForLoadState("networkidle");
  await operator.getByLabel("CSV file from the cycler (up to 200 MiB)").setInputFiles({ name: "chain.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  await expect(operator.getByTestId("mapping-preview")).toBeVisible();
  await operator.getByRole("button", { name: /^Upload chain\.csv/ }).click();
  await expect(operator.getByRole("status").filter({ hasText: "Log stored" })).toContainText("specimen conforms", { timeout: 60_000 });
  await operator.goto(`/runs/${runId}`);
  await operator.getByRole("button", { name: "Submit the run for review" }).click();
  await expect(operator.getByTestId("run-status")).toHaveText(/submitted for review/);

  // The second engineer, who did not operate the run, accepts it and issues the certificate.
  await reviewer.goto(`/runs/${runId}/review`);
  await reviewer.getByLabel("Your password, to sign").fill(password("engineer2@brackwater.example"));
  await reviewer.getByRole("button", { name: `Sign as reviewed and accept run ${runNumber}` }).click();
  await expect(reviewer.getByTestId("run-status")).toHaveText(/accepted/);
  await reviewer.getByLabel("Your password, to sign").fill(password("engineer2@brackwater.example"));
  await reviewer.getByRole("button", { name: "Sign and issue the certificate" }).click();
  const issued = reviewer.getByRole("region", { name: "Certificate" }).getByRole("link", { name: /^C-\d{5}$/ });
  await expect(issued).toBeVisible({ timeout: 60_000 });
  await expect(reviewer.getByTestId("run-status")).toHaveText(/certified/);
  const certificateNumber = (await issued.textContent())!.trim();

  // The auditor finds it, downloads the PDF and checks it publicly.
  const auditor = await asRole(browser, baseURL!, "auditor");
  await auditor.goto(`/certificates?spec=`);
  await auditor.getByRole("link", { name: certificateNumber }).click();
  await expect(auditor.getByRole("heading", { name: `Certificate ${certificateNumber}` })).toBeVisible();
  const downloading = auditor.waitForEvent("download");
  await auditor.getByRole("link", { name: "Download the PDF" }).click();
  const download = await downloading;
  const pdfPath = await download.path();
  const { readFile } = await import("node:fs/promises");
  const pdf = await readFile(pdfPath!);
  expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");

  const publicContext = await browser.newContext();
  const anyone = await publicContext.newPage();
  await anyone.goto(`/check/${certificateNumber}`);
  await expect(anyone.getByRole("heading", { name: new RegExp(`Certificate ${certificateNumber} is .*valid`) })).toBeVisible();
  await anyone.getByLabel("Certificate PDF").setInputFiles({ name: `${certificateNumber}.pdf`, mimeType: "application/pdf", buffer: pdf });
  await anyone.getByRole("button", { name: "Check this PDF" }).click();
  await expect(anyone.getByTestId("check-top").getByRole("status").filter({ hasText: `Genuine and valid: ${certificateNumber}.pdf is certificate ${certificateNumber} as issued` })).toBeVisible();
  await expect(anyone.getByTestId("check-result")).toContainText("byte-identical to the issued PDF");

  // One changed byte inside the signed range: not identical, and the signature no longer verifies.
  const tampered = Buffer.from(pdf);
  const at = tampered.indexOf("Brackwater");
  tampered[at] = "X".charCodeAt(0);
  await anyone.getByLabel("Certificate PDF").setInputFiles({ name: "changed.pdf", mimeType: "application/pdf", buffer: tampered });
  await anyone.getByRole("button", { name: "Check this PDF" }).click();
  // The verdict for the file takes the top banner's place: no green "Valid" above a refusal.
  await expect(anyone.getByTestId("check-top").getByRole("status").filter({ hasText: "Not the certificate as issued: do not rely on changed.pdf" })).toBeVisible();
  await expect(anyone.getByTestId("check-top")).not.toContainText("Genuine");
  await expect(anyone.getByTestId("check-top").getByText("Valid", { exact: true })).toHaveCount(0);
  await expect(anyone.getByTestId("check-result")).toContainText("does not verify");

  // The notices reached the catcher: run submitted to the engineers, certificate issued to the auditors.
  await expect
    .poll(async () => (await readCatcher()).filter((m) => m.subject === `Run ${runNumber} submitted for review`).flatMap((m) => m.to), { timeout: 30_000 })
    .toEqual(expect.arrayContaining(["engineer@brackwater.example", "engineer2@brackwater.example"]));
  await expect
    .poll(async () => (await readCatcher()).filter((m) => m.subject.startsWith(`Certificate ${certificateNumber} issued`)).flatMap((m) => m.to), { timeout: 30_000 })
    .toContain("auditor@brackwater.example");
});
