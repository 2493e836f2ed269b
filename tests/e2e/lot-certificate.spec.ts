import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { expect, test } from "@playwright/test";
import pg from "pg";
import { DEMO_LOT_B } from "../../scripts/demo-lot-scenario";
import { demoUser, signInAs } from "./fixtures";

async function findLotId(identifier: string): Promise<string> {
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    const r = await client.query<{ id: string }>("select id from lot where identifier = $1", [identifier]);
    if (!r.rows[0]) throw new Error(`no lot ${identifier} in the e2e database`);
    return r.rows[0].id;
  } finally {
    await client.end();
  }
}

/**
 * The demo lot KV48-2612-B is seeded decided (13 drawn cells, every one conforming: accept). Its runs
 * were operated by operator@ and reviewed by engineer2@, so engineer@ may sign its certificate. The
 * auditor then finds it on the lot page, downloads the PDF and sees it in the certificate list.
 */
test("an engineer signs and issues the lot certificate; the auditor downloads it from the lot page", async ({ browser, baseURL }) => {
  test.setTimeout(90_000);
  const lotUrl = `/lots/${await findLotId(DEMO_LOT_B.identifier)}`;

  const engineerContext = await browser.newContext();
  await signInAs(engineerContext, baseURL!, "engineer");
  const engineer = await engineerContext.newPage();
  await engineer.goto(lotUrl);
  await expect(engineer.getByTestId("lot-decision")).toContainText("Accept the lot");
  const form = engineer.getByRole("form", { name: "Sign and issue the lot certificate" });
  await expect(form.getByTestId("lot-certificate-meaning")).toHaveText("approved: authorised the certificate for issue");
  const passwordField = form.getByLabel("Your password, to sign");
  await expect(passwordField).toHaveAttribute("autocomplete", "current-password");

  // A wrong password signs nothing.
  await passwordField.fill("not the password");
  await form.getByRole("button", { name: "Sign and issue the lot certificate" }).click();
  await expect(form.getByRole("alert").filter({ hasText: "password is not right" }).first()).toBeVisible();
  await expect(engineer.getByTestId("lot-certificates")).toHaveCount(0);

  await passwordField.fill(demoUser("engineer").password);
  await form.getByRole("button", { name: "Sign and issue the lot certificate" }).click();
  // Once issued, the page lists the certificate in place of the form.
  await expect(engineer.getByTestId("lot-certificates")).toContainText(/C-\d{5}/);
  const number = (await engineer.getByTestId("lot-certificates").textContent())!.match(/C-\d{5}/)![0];
  await expect(engineer.getByTestId("lot-certificates")).toContainText("valid");
  await expect(engineer.getByRole("form", { name: "Sign and issue the lot certificate" })).toHaveCount(0);
  await engineerContext.close();

  const auditorContext = await browser.newContext({ acceptDownloads: true });
  await signInAs(auditorContext, baseURL!, "auditor");
  const auditor = await auditorContext.newPage();
  await auditor.goto(lotUrl);
  const section = auditor.getByRole("region", { name: "Lot certificate" });
  await expect(section.getByRole("link", { name: number, exact: true })).toHaveAttribute("href", `/certificates/${number}`);
  await expect(auditor.getByRole("form", { name: "Sign and issue the lot certificate" })).toHaveCount(0);
  const [download] = await Promise.all([auditor.waitForEvent("download"), section.getByRole("link", { name: `Download the PDF of ${number}` }).click()]);
  expect(download.suggestedFilename()).toBe(`${number}.pdf`);
  const dir = mkdtempSync(join(tmpdir(), "cellwright-e2e-lot-"));
  try {
    const file = join(dir, "lot.pdf");
    await download.saveAs(file);
    expect(readFileSync(file).subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const text = execFileSync("pdftotext", ["-raw", file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    expect(text).toContain(`lot ${DEMO_LOT_B.identifier}`);
    expect(text).toContain("Lot accepted");
    expect(text).toMatch(/Code letter E/);
    expect(text).toContain(`End of certificate ${number}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }

  await auditor.goto("/certificates");
  const row = auditor.getByRole("row").filter({ hasText: number });
  await expect(row).toContainText("lot accepted");
  await expect(row).toContainText(DEMO_LOT_B.identifier);
  await auditorContext.close();
});
