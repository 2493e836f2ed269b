import { expect, test, type Browser, type Page } from "@playwright/test";
import pg from "pg";
import { DEMO_USERS } from "@/scenarios/demo-lab";
import { signInAsUser } from "./fixtures";

// The seeded run R-00002 (scripts/seed-library.ts): operated, evaluated and submitted by the demo
// operator, Priya Raman; neither engineer operated it.
const RUN_NUMBER = "R-00002";
const ENGINEER = DEMO_USERS.find((u) => u.email === "engineer@brackwater.example")!;
const ENGINEER_2 = DEMO_USERS.find((u) => u.email === "engineer2@brackwater.example")!;
const OPERATOR = DEMO_USERS.find((u) => u.email === "operator@brackwater.example")!;
const AUDITOR = DEMO_USERS.find((u) => u.email === "auditor@brackwater.example")!;

async function findRun(): Promise<{ id: string; status: string }> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    const r = await c.query(`select id, status from run where number = $1`, [RUN_NUMBER]);
    if (r.rowCount !== 1) throw new Error(`the e2e database has no run ${RUN_NUMBER}: seed it with scripts/seed.ts`);
    return r.rows[0];
  } finally {
    await c.end();
  }
}

async function pageAs(browser: Browser, baseURL: string, email: string): Promise<Page> {
  const context = await browser.newContext({ baseURL });
  await signInAsUser(context, baseURL, email);
  return context.newPage();
}

test("an engineer returns R-00002 with comments, its operator reads them and may not review it, and another engineer signs it as reviewed", async ({ browser, baseURL }) => {
  // Four people in turn and two password checks at signing (argon2 each): more than the default 30 s on a loaded 2-core machine.
  test.setTimeout(120_000);
  const run = await findRun();
  expect(run.status, `${RUN_NUMBER} must be as seeded (submitted); another spec changed it`).toBe("submitted");
  const comments = "The rest step's ambient readings name no instrument. Record the climate chamber CC-01 for them and submit again.";

  await test.step("engineer2 finds the run in the review queue and returns it with comments", async () => {
    const page = await pageAs(browser, baseURL!, ENGINEER_2.email);
    await page.goto("/");
    const queue = page.getByTestId("review-queue");
    await expect(queue).toContainText(RUN_NUMBER);
    await expect(queue).toContainText(OPERATOR.displayName);
    await queue.getByRole("link", { name: `Review run ${RUN_NUMBER}` }).click();
    await expect(page).toHaveURL(new RegExp(`/runs/${run.id}/review$`));
    await expect(page.getByTestId("verdict")).toContainText("Procedure followedyes");
    await expect(page.getByText("No finding of this evaluation deviates")).toBeVisible();
    await expect(page.getByRole("link", { name: "findings, results and plots" })).toHaveAttribute("href", `/runs/${run.id}/results`);

    await page.getByLabel(`What ${OPERATOR.displayName} must fix`).fill(comments);
    await page.getByRole("button", { name: `Return the run to ${OPERATOR.displayName}` }).click();
    await expect(page.getByTestId("run-status")).toHaveText(/returned to the operator/);
    await expect(page.getByText(`${ENGINEER_2.displayName} returned run ${RUN_NUMBER}`)).toBeVisible();
    await page.context().close();
  });

  await test.step("the operator reads the comments on the step sheet, is told they cannot review, and submits again", async () => {
    const page = await pageAs(browser, baseURL!, OPERATOR.email);
    await page.goto(`/runs/${run.id}`);
    const note = page.getByTestId("return-comments");
    await expect(note).toContainText(`Returned to you by ${ENGINEER_2.displayName}`);
    await expect(note).toContainText(comments);

    await page.getByRole("link", { name: "Review", exact: true }).click();
    await expect(page.getByTestId("review-refused")).toContainText("You took part in this run, so you cannot review it");
    await expect(page.getByRole("button", { name: /Sign as reviewed/ })).toHaveCount(0);

    await page.goto(`/runs/${run.id}`);
    await page.getByRole("button", { name: "Submit the run for review" }).click();
    await expect(page.getByTestId("run-status")).toHaveText(/submitted for review/);
    await expect(page.getByTestId("return-comments")).toHaveCount(0);
    await page.context().close();
  });

  await test.step("an engineer who operated nothing signs it as reviewed; a wrong password is refused first", async () => {
    const page = await pageAs(browser, baseURL!, ENGINEER.email);
    await page.goto(`/runs/${run.id}/review`);
    await expect(page.getByTestId("accept-meaning")).toHaveText(/^reviewed: checked the records, findings and results/);
    const password = page.getByLabel("Your password, to sign");
    await expect(password).toHaveAttribute("autocomplete", "current-password");

    await password.fill("not-the-password");
    await page.getByRole("button", { name: `Sign as reviewed and accept run ${RUN_NUMBER}` }).click();
    await expect(page.getByRole("alert").filter({ hasText: "That password is not right. Nothing was signed." })).toBeVisible();
    await expect(page.getByTestId("run-status")).toHaveText(/submitted for review/);

    await password.fill(ENGINEER.password);
    await page.getByRole("button", { name: `Sign as reviewed and accept run ${RUN_NUMBER}` }).click();
    await expect(page.getByTestId("run-status")).toHaveText(/accepted/);
    // The manifestation in the run's header, on every tab (21 CFR 11.50).
    const signed = page.getByRole("list", { name: "Electronic signatures" });
    await expect(signed).toContainText(`Reviewed by ${ENGINEER.displayName}`);
    await expect(signed).toContainText(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC — meaning: reviewed/);
    await expect(page.getByRole("button", { name: "Sign and issue the certificate" })).toBeVisible();
    await page.getByRole("link", { name: "Findings and results" }).click();
    await expect(page.getByRole("list", { name: "Electronic signatures" })).toContainText(`Reviewed by ${ENGINEER.displayName}`);
    await page.context().close();
  });

  await test.step("the auditor reads the reviews and the run's audit trail", async () => {
    const page = await pageAs(browser, baseURL!, AUDITOR.email);
    await page.goto(`/runs/${run.id}/history`);
    const reviews = page.getByTestId("run-reviews");
    await expect(reviews.getByRole("listitem").first()).toContainText(`Returned to the operator by ${ENGINEER_2.displayName}`);
    await expect(reviews).toContainText(comments);
    await expect(reviews).toContainText(`Accepted by ${ENGINEER.displayName}`);
    await expect(reviews).toContainText(`Reviewed by ${ENGINEER.displayName}`);
    const trail = page.getByTestId("run-audit-trail");
    await expect(trail).toContainText("returned a run to its operator with comments");
    await expect(trail).toContainText("accepted a run and signed it as reviewed");
    // Auditors read; the review tab is not theirs.
    await expect(page.getByRole("link", { name: "Review", exact: true })).toHaveCount(0);
    await page.context().close();
  });
});
