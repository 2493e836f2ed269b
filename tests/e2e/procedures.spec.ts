import { expect, test } from "@playwright/test";
import { signInAs, signInAsUser } from "./fixtures";
import { DEMO_USERS } from "@/scenarios/demo-lab";

// The second engineer, who releases: the demo account's own password.
const RELEASER_PASSWORD = DEMO_USERS.find((u) => u.email === "engineer2@brackwater.example")!.password;

// One journey across three people: an engineer writes from the rated-capacity template and previews it
// against a demo cell, a second engineer releases it, and an operator reads it without any controls.
test("an engineer drafts from a template, a second engineer releases it, an operator reads it", async ({ browser, baseURL }) => {
  // Three people in turn and two password checks at signing (argon2 each): more than the default 30 s on a loaded machine.
  test.setTimeout(90_000);
  const code = `BW-RC20-${Date.now() % 100000}`;

  const author = await browser.newContext();
  await signInAs(author, baseURL!, "engineer");
  const page = await author.newPage();
  await page.goto("/procedures/new");
  await page.getByRole("radio", { name: "Rated capacity at 20 °C" }).check();
  await page.getByLabel("Code of the new procedure").fill(code);
  await page.getByRole("button", { name: "Create draft" }).click();
  await expect(page).toHaveURL(/\/procedures\/[0-9a-f-]+\/versions\/1\/edit$/);
  await page.locator('.ProseMirror[contenteditable="true"]').first().waitFor();

  // Preview against the invented 4 850 mAh cell: 0.2 It = 0.97 A (IEC 61434; the 0.97 A case is common practice).
  const preview = page.getByTestId("procedure-preview");
  await preview.getByLabel("Cell specification").selectOption({ label: "Korvel Energy KV-21N48 (INR22/71)" });
  await expect(preview.getByTestId("resolved-step-discharge")).toContainText("0.97 A");
  await expect(preview.getByText("Ready to run on this cell")).toBeVisible();

  // Bad input: a rest whose longest time is below its shortest is refused with its field named; nothing saved.
  const rest = page.getByRole("region", { name: /Step 3/ });
  await rest.getByRole("button", { name: "Edit fields of step 3" }).click();
  const longest = rest.getByRole("group", { name: "Longest rest" }).getByLabel("Value");
  await longest.fill("0.5");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "The draft was not saved" })).toBeVisible();
  await longest.fill("4");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("status").filter({ hasText: "saved as a draft" })).toBeVisible();

  await page.goto(`/procedures?q=${code}`);
  await page.getByRole("link", { name: "Rated capacity at 20 °C" }).click();
  await page.getByRole("button", { name: "Submit for review" }).click();
  await expect(page.getByTestId("version-1")).toContainText("Submitted for review by Dana Okafor");
  await page.reload();
  await expect(page.getByText("Waiting for a second engineer")).toBeVisible();
  const procedureUrl = page.url();

  const second = await browser.newContext();
  await signInAsUser(second, baseURL!, "engineer2@brackwater.example");
  const secondPage = await second.newPage();
  await secondPage.goto(procedureUrl);
  await secondPage.getByRole("link", { name: "Release version 1" }).click();
  // Release is a signature: what is approved (first version, no earlier one to compare), then the password.
  await expect(secondPage.getByRole("heading", { name: "First version" })).toBeVisible();
  await expect(secondPage.getByTestId("release-meaning")).toHaveText(/approved for use/);
  const password = secondPage.getByLabel("Your password, to sign");
  await password.fill("not-the-password");
  await secondPage.getByRole("button", { name: "Sign and release version 1" }).click();
  await expect(secondPage.getByRole("alert").filter({ hasText: "That password is not right" })).toBeVisible();
  await expect(password, "a refused password is cleared").toHaveValue("");
  await password.fill(RELEASER_PASSWORD);
  await secondPage.getByRole("button", { name: "Sign and release version 1" }).click();
  await expect(secondPage.getByTestId("signature-manifestation")).toContainText("Released by Tomas Lindqvist");
  await secondPage.goto(procedureUrl);
  await expect(secondPage.getByTestId("version-1")).toContainText("Released by Tomas Lindqvist");
  await expect(secondPage.getByTestId("version-1").getByTestId("signature-manifestation")).toContainText("approved for use");

  const operator = await browser.newContext();
  await signInAs(operator, baseURL!, "operator");
  const opPage = await operator.newPage();
  await opPage.goto(procedureUrl);
  await expect(opPage.getByTestId("version-1")).toContainText("released");
  await expect(opPage.getByRole("link", { name: "Edit draft" })).toHaveCount(0);
  await expect(opPage.getByRole("button", { name: /Release|Withdraw|Submit/ })).toHaveCount(0);
  await opPage.getByRole("link", { name: "Version 1" }).click();
  await expect(opPage.getByRole("heading", { name: "Safety cautions" })).toBeVisible();
  const opEdit = await opPage.goto(`${procedureUrl}/versions/1/edit`);
  expect(opEdit?.status()).toBe(403);

  await Promise.all([author.close(), second.close(), operator.close()]);
});
