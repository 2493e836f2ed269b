import { randomBytes } from "node:crypto";
import pg from "pg";
import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";

/** Queues a message straight into the e2e database's outbox, as a service would in its transaction. */
async function queueMessage(m: { kind: string; recipients: string[]; subject: string; body: string; attempts?: number; lastError?: string }): Promise<void> {
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    await client.query(
      `insert into mail_message (kind, recipients, subject, body, attempts, last_error) values ($1, $2, $3, $4, $5, $6)`,
      [m.kind, m.recipients, m.subject, m.body, m.attempts ?? 0, m.lastError ?? null],
    );
  } finally {
    await client.end();
  }
}

test("an operator opening the e-mail page gets the forbidden page", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "operator");
  const response = await page.goto("/admin/mail");
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
  await expect(page.getByRole("link", { name: "E-mail" })).toHaveCount(0);
});

test("an admin sees a queued notice go out and arrive at the local catcher, and one the sender gave up on with its error", async ({ page, context, baseURL }) => {
  const tag = randomBytes(3).toString("hex");
  const subject = `Calibration of thermometer TH-E2E-${tag} due on 2027-01-05`;
  await queueMessage({ kind: "calibration-due", recipients: ["admin@brackwater.example"], subject, body: `The calibration of thermometer TH-E2E-${tag} is due.` });
  const hopeless = `Certificate C-E2E-${tag} issued`;
  await queueMessage({ kind: "certificate-issued", recipients: ["nobody@brackwater.example"], subject: hopeless, body: "b", attempts: 12, lastError: "550 5.1.1 mailbox unavailable" });

  await signInAs(context, baseURL!, "admin");
  await page.goto("/admin/mail");
  await expect(page.getByRole("heading", { name: "E-mail", level: 1 })).toBeVisible();
  await expect(page.getByRole("link", { name: "E-mail" })).toHaveAttribute("aria-current", "page");

  const given = page.getByTestId("outbox-message").filter({ hasText: hopeless });
  await expect(given).toHaveAttribute("data-state", "gave-up");
  await expect(given).toContainText("gave up after 12 attempts");
  await expect(given).toContainText("Last error: 550 5.1.1 mailbox unavailable");

  const row = page.getByTestId("outbox-message").filter({ hasText: subject });
  await expect(row).toContainText("calibration due");
  await expect(row).toContainText("admin@brackwater.example");

  if (!process.env.SMTP_HOST) {
    // Run without the scripts' mail catcher: nothing can be sent, and the page says why.
    await expect(page.getByText("No mail server set")).toBeVisible();
    await expect(row).toHaveAttribute("data-state", "waiting");
    return;
  }
  await expect(page.getByText("Mail goes to a local stand-in")).toBeVisible();
  await expect(page.getByText(/A real lab sets SMTP_HOST/)).toBeVisible();
  // The app's mail loop sends it within a few seconds (every 2 s under test).
  await expect(async () => {
    await page.reload();
    await expect(row).toHaveAttribute("data-state", "sent", { timeout: 1_000 });
  }).toPass({ timeout: 20_000 });
  await expect(row).toContainText(/sent at \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);

  // What the catcher received, readable on click.
  const caught = page.getByTestId("caught-message").filter({ hasText: subject });
  await expect(caught).toHaveCount(1);
  await expect(caught).toContainText("admin@brackwater.example");
  await caught.getByText(subject).click();
  await expect(caught.getByText(`The calibration of thermometer TH-E2E-${tag} is due.`)).toBeVisible();
  // The sender never tries a given-up message again.
  await expect(page.getByTestId("caught-message").filter({ hasText: hopeless })).toHaveCount(0);
});
