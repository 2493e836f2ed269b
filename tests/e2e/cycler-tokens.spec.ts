import { expect, test } from "@playwright/test";
import pg from "pg";
import { signInAs } from "./fixtures";

/** The demo lab's first cycler channel, as a fresh e2e database has it. */
const CHANNEL = "CY1-CH01";

async function query<T extends pg.QueryResultRow>(text: string, values: unknown[] = []): Promise<T[]> {
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await db.connect();
  try {
    return (await db.query<T>(text, values)).rows;
  } finally {
    await db.end();
  }
}

/** An administrator issues a token in the browser and reads it off the page, the one time it is shown. */
async function issueToken(page: import("@playwright/test").Page, label: string): Promise<string> {
  await page.goto("/admin/cycler-tokens");
  const channel = page.getByLabel("Cycler channel");
  await channel.selectOption((await channel.locator("option", { hasText: CHANNEL }).getAttribute("value"))!);
  await page.getByLabel("Label").fill(label);
  await page.getByRole("button", { name: "Issue token" }).click();
  const shown = page.getByLabel("The new token");
  await expect(shown).toHaveValue(/^cwt_[A-Za-z0-9_-]{43}$/);
  return shown.inputValue();
}

test("an administrator issues a token, sees it once, and revokes it; the page says a push never controls the cycler", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "admin");
  await page.goto("/admin/cycler-tokens");
  await expect(page.getByText("Pushing a log never controls the cycler")).toBeVisible();

  // Refused in plain words: no label.
  await page.getByRole("button", { name: "Issue token" }).click();
  await expect(page.getByText("Give the token a label")).toBeVisible();

  const token = await issueToken(page, "Cycler PC, bay 1");
  await expect(page.getByRole("status").filter({ hasText: `Token issued for ${CHANNEL}` })).toContainText("shown only this once");
  await page.screenshot({ path: "test-results/cycler-tokens-issued.png", fullPage: true });

  // Shown once: after a reload only its first characters are listed, never the token.
  await page.reload();
  await expect(page.getByLabel("The new token")).toHaveCount(0);
  expect(await page.content()).not.toContain(token);
  const row = page.getByTestId("cycler-tokens").getByRole("row").filter({ hasText: "Cycler PC, bay 1" });
  await expect(row).toContainText(`${token.slice(0, 10)}…`);
  await expect(row).toContainText(CHANNEL);
  await expect(row).toContainText("never");

  await row.getByLabel("Reason to revoke").fill("PC replaced");
  await row.getByRole("button", { name: "Revoke" }).click();
  // The list is drawn again at once: the row now says who revoked it and why.
  await expect(page.getByTestId("cycler-tokens").getByRole("row").filter({ hasText: "Cycler PC, bay 1" })).toContainText("Revoked", { timeout: 15_000 });
  await page.reload();
  await expect(page.getByTestId("cycler-tokens").getByRole("row").filter({ hasText: "Cycler PC, bay 1" })).toContainText(": PC replaced");
  await page.screenshot({ path: "test-results/cycler-tokens-revoked.png", fullPage: true });

  const audit = await query<{ action: string }>(`select action from audit_event where action like 'machine-token.%' order by id`);
  expect(audit.map((a) => a.action).slice(-2)).toEqual(["machine-token.issue", "machine-token.revoke"]);
});
