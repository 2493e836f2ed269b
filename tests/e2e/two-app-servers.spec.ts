import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type Browser, type Page } from "@playwright/test";
import pg from "pg";
import { formatLogCsv } from "../../lib/analysis";
import { readPdfSignature } from "../../lib/certificates/verify-pdf-signature";
import type { ProcedureResolution } from "../../protocols";
import { DEMO_CELL_SPECIFICATIONS, DEMO_USERS } from "@/scenarios/demo-lab";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";
import { signInAs, signInAsUser } from "./fixtures";

// Two app servers on one database, one object store and one set of secrets (docs/deployment.md): the
// configured server of playwright.config.ts (instance 1) and a second one started here on E2E_PORT + 50
// (instance 2). The journey's requests alternate between them, so nothing may live only in one server's
// memory or on its disk: sessions, uploaded logs, the evaluation, the signing key, the stored PDF.
// The session cookie is set for "localhost", which browsers send to every port of it.

const PORT_1 = Number(process.env.E2E_PORT ?? 3100);
const PORT_2 = PORT_1 + 50;
const ONE = `http://localhost:${PORT_1}`;
const TWO = `http://localhost:${PORT_2}`;
const REVIEWER = DEMO_USERS.find((u) => u.email === "engineer2@brackwater.example")!;

let second: ChildProcess | undefined;
let secondLog = "";

async function waitForHealth(url: string, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // Not listening yet.
    }
    if (second?.exitCode !== null && second?.exitCode !== undefined) throw new Error(`instance 2 exited (${second.exitCode}):\n${secondLog}`);
    if (Date.now() > until) throw new Error(`instance 2 did not answer on ${url} within ${timeoutMs} ms:\n${secondLog}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

test.beforeAll(async () => {
  test.setTimeout(90_000);
  // The same build, database, object store, mail catcher and keys as instance 1 (playwright.config.ts's webServer).
  second = spawn(process.execPath, ["scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(PORT_2)], {
    env: {
      ...process.env,
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? "",
      CELLWRIGHT_PUBLIC_URL: ONE,
      MAIL_DISPATCH_INTERVAL_MS: "2000",
      NEXT_TELEMETRY_DISABLED: "1",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  second.stdout?.on("data", (d: Buffer) => (secondLog += d.toString()));
  second.stderr?.on("data", (d: Buffer) => (secondLog += d.toString()));
  await waitForHealth(TWO, 80_000);
});

test.afterAll(async () => {
  if (!second || second.exitCode !== null) return;
  const exited = new Promise((resolve) => second!.once("exit", resolve));
  second.kill("SIGTERM");
  await Promise.race([exited, new Promise((resolve) => setTimeout(resolve, 5_000))]);
  if (second.exitCode === null) second.kill("SIGKILL");
});

async function pageFor(browser: Browser, who: "operator" | "auditor" | "reviewer"): Promise<Page> {
  const context = await browser.newContext({ acceptDownloads: true });
  if (who === "reviewer") await signInAsUser(context, ONE, REVIEWER.email);
  else await signInAs(context, ONE, who);
  return context.newPage();
}

async function withDb<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

async function chooseOption(select: import("@playwright/test").Locator, text: string): Promise<void> {
  const value = await select.locator("option", { hasText: text }).first().getAttribute("value");
  expect(value, `an option containing "${text}"`).toBeTruthy();
  await select.selectOption(value!);
}

test("upload → evaluation → review → certificate → download, with requests alternating between two app servers", async ({ browser }) => {
  test.setTimeout(150_000);
  const specimen = `KV-TWO-${Date.now() % 100000}`;
  await withDb((c) =>
    c.query(
      `insert into specimen (identifier, cell_specification_id, received_on, condition_on_receipt, created_by)
       select $1, s.id, current_date, 'as received, no marks', u.id from cell_specification s, app_user u
       where s.model = 'KV-21N48' and u.email = 'operator@brackwater.example'`,
      [specimen],
    ),
  );
  const operator = await pageFor(browser, "operator");
  const reviewer = await pageFor(browser, "reviewer");
  const auditor = await pageFor(browser, "auditor");

  // Instance 1 starts a run of the seeded, released rated-capacity procedure.
  await operator.goto(`${ONE}/runs/new`);
  await chooseOption(operator.getByLabel("Procedure version (released)"), "TPL-RC20");
  await chooseOption(operator.getByLabel("Specimen"), specimen);
  await operator.getByRole("checkbox", { name: /cycler channel CY1-CH01/ }).check();
  await operator.getByRole("checkbox", { name: /^(thermometer|climate chamber) / }).first().check();
  await operator.getByRole("button", { name: "Start the run" }).click();
  await expect(operator).toHaveURL(new RegExp(`^${ONE}/runs/[0-9a-f-]+$`));
  const runId = operator.url().split("/").pop()!;

  // The step sheet is covered by its own spec: the records go straight to the database, as certificate-chain does.
  const { csv, runNumber } = await withDb(async (c) => {
    const run = (await c.query(`select number, resolution, operator_id from run where id = $1`, [runId])).rows[0];
    const korvel = DEMO_CELL_SPECIFICATIONS.find((s) => s.model === "KV-21N48")!;
    const built = buildRatedCapacityRun({ cell: korvel.data, resolution: run.resolution as ProcedureResolution, cellModel: { capacityMAh: 5050 }, sampleIntervalS: 5 });
    for (const r of built.input.stepRecords) {
      await c.query(`insert into step_record (run_id, step_id, cycle, record, completed, recorded_by) values ($1, $2, $3, $4, true, $5)`, [
        runId,
        r.stepId,
        r.cycle ?? 1,
        JSON.stringify({ ambientReadings: [], programmed: {}, acknowledgedCautionCodes: [], ...r }),
        run.operator_id,
      ]);
    }
    await c.query(`update run set status = 'in_progress', started_at = now() where id = $1`, [runId]);
    const text = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current", "temperature"] });
    if (!text.ok) throw new Error(text.error.message);
    return { csv: text.value, runNumber: run.number as string };
  });

  // Instance 2 takes the upload. The evaluation may come from the request or from a background worker:
  // wait until instance 1 reports an evaluation of the log just stored.
  await operator.goto(`${TWO}/runs/${runId}/log`);
  await operator.waitForLoadState("networkidle");
  await operator.getByLabel("CSV file from the cycler (up to 200 MiB)").setInputFiles({ name: "two-servers.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  await expect(operator.getByTestId("mapping-preview")).toBeVisible();
  await operator.getByRole("button", { name: /^Upload two-servers\.csv/ }).click();
  await expect
    .poll(
      async () => {
        const res = await operator.request.get(`${ONE}/api/runs/${runId}`);
        if (!res.ok()) return `HTTP ${res.status()}`;
        const body = (await res.json()) as { log: { id: string; fileName: string } | null; evaluation: { runLogId: string } | null };
        return body.log?.fileName === "two-servers.csv" && body.evaluation?.runLogId === body.log.id ? "evaluated" : "waiting";
      },
      { timeout: 60_000, intervals: [500, 1000, 2000] },
    )
    .toBe("evaluated");

  // Instance 1 shows the evaluation the upload on instance 2 produced; the operator submits there.
  await operator.goto(`${ONE}/runs/${runId}/results`);
  await expect(operator.getByRole("region", { name: "Verdict" })).toContainText("Specimen: conforms.");
  await operator.goto(`${ONE}/runs/${runId}`);
  await operator.getByRole("button", { name: "Submit the run for review" }).click();
  await expect(operator.getByTestId("run-status")).toHaveText(/submitted for review/);

  // Instance 2 takes the review and its signature.
  await reviewer.goto(`${TWO}/runs/${runId}/review`);
  await reviewer.getByLabel("Your password, to sign").fill(REVIEWER.password);
  await reviewer.getByRole("button", { name: `Sign as reviewed and accept run ${runNumber}` }).click();
  await expect(reviewer.getByTestId("run-status")).toHaveText(/accepted/);

  // Instance 1 renders, signs and issues the certificate.
  await reviewer.goto(`${ONE}/runs/${runId}/review`);
  await reviewer.getByLabel("Your password, to sign").fill(REVIEWER.password);
  await reviewer.getByRole("button", { name: "Sign and issue the certificate" }).click();
  const issued = reviewer.getByRole("region", { name: "Certificate" }).getByRole("link", { name: /^C-\d{5}$/ });
  await expect(issued).toBeVisible({ timeout: 60_000 });
  const certificateNumber = (await issued.textContent())!.trim();

  // Instance 2 hands out the PDF instance 1 stored: the same bytes, a signature that verifies, made with
  // the one lab key both servers read from the database.
  await auditor.goto(`${TWO}/certificates/${certificateNumber}`);
  const downloading = auditor.waitForEvent("download");
  await auditor.getByRole("link", { name: "Download the PDF" }).click();
  const pdfPath = (await (await downloading).path())!;
  const pdf = await readFile(pdfPath);
  const recorded = await withDb(async (c) => (await c.query(`select pdf_sha256 from certificate where number = $1`, [certificateNumber])).rows[0]);
  expect(createHash("sha256").update(pdf).digest("hex")).toBe(recorded.pdf_sha256);
  // pdfsig (Debian's poppler-utils, installed by scripts/test.sh) checks the signature independently of our code.
  const pdfsig = spawnSync("pdfsig", [pdfPath], { encoding: "utf8" });
  const pdfsigReport = pdfsig.error ? String(pdfsig.error) : `${pdfsig.stdout}${pdfsig.stderr}`;
  expect(pdfsigReport).toMatch(/Signature Validation: Signature is Valid\./);
  const reading = readPdfSignature(pdf);
  expect(reading).toMatchObject({ present: true, valid: true, signer: "Brackwater Cell Test Laboratory" });

  const admin = await browser.newContext();
  await signInAs(admin, ONE, "admin");
  const adminPage = await admin.newPage();
  const fingerprints: string[] = [];
  for (const instance of [ONE, TWO]) {
    await adminPage.goto(`${instance}/admin/signing-key`);
    fingerprints.push((await adminPage.getByTestId("signing-fingerprint").textContent())!.trim());
  }
  expect(fingerprints[1]).toBe(fingerprints[0]);
  expect(reading.signerFingerprintSha256).toBe(fingerprints[0]);

  // The public check on instance 2 calls it genuine: byte-identical and signed with the lab's current key.
  const anyone = await (await browser.newContext()).newPage();
  await anyone.goto(`${TWO}/check/${certificateNumber}`);
  await anyone.getByLabel("Certificate PDF").setInputFiles({ name: `${certificateNumber}.pdf`, mimeType: "application/pdf", buffer: pdf });
  await anyone.getByRole("button", { name: "Check this PDF" }).click();
  await expect(anyone.getByTestId("check-top").getByRole("status").filter({ hasText: `Genuine and valid: ${certificateNumber}.pdf is certificate ${certificateNumber} as issued` })).toBeVisible();
});
