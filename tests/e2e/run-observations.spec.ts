import { expect, test, type Locator, type Page } from "@playwright/test";
import { signInAs } from "./fixtures";

async function chooseOption(select: Locator, text: string): Promise<void> {
  const value = await select.locator("option", { hasText: text }).first().getAttribute("value");
  expect(value, `an option containing "${text}"`).toBeTruthy();
  await select.selectOption(value!);
}

/** Marks the start, records the ambient and the observations, marks the end and ticks the line. */
async function recordLine(page: Page, key: string, fill: (form: Locator) => Promise<void>): Promise<void> {
  const line = page.getByTestId(`step-line-${key}`);
  await line.getByRole("button", { name: "Mark start" }).click();
  await expect(line.getByTestId("step-started-at")).toBeVisible();
  const form = line.getByTestId("current-step-form");
  await form.getByLabel("Reading (°C)").fill("21.4");
  await fill(form);
  await form.getByRole("button", { name: "Save the step" }).click();
  await expect(line.getByTestId("recorded-readings")).toContainText("21.4 °C");
  await line.getByRole("button", { name: "Mark end" }).click();
  await expect(line.getByTestId("step-ended-at")).toBeVisible();
  await line.getByTestId("current-step-form").getByLabel("Step carried out: tick it off").check();
  await line.getByTestId("current-step-form").getByRole("button", { name: "Save the step" }).click();
  await expect(line).toHaveAttribute("data-state", "done");
}

test("an operator records observations before and after storage without a data log, and the results show each criterion", async ({ page, context, baseURL }) => {
  test.setTimeout(120_000);
  await signInAs(context, baseURL!, "operator");
  await page.goto("/runs/new");
  await chooseOption(page.getByLabel("Procedure version (released)"), "TPL-OBS");
  await chooseOption(page.getByLabel("Specimen"), "KV48-2611-A-006");
  await page.getByRole("checkbox", { name: /balance BAL-01/ }).check();
  await page.getByRole("checkbox", { name: /^(thermometer|climate chamber) / }).first().check();
  await page.getByRole("button", { name: "Start the run" }).click();
  await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
  const runUrl = page.url();

  // Bad input is refused in plain words beside its field, and nothing is recorded.
  const before = page.getByTestId("step-line-before#1");
  const observations = before.getByTestId("observation-fields");
  await expect(observations.getByText(/Caution: a cell that leaks, vents/)).toBeVisible();
  await observations.getByLabel("Mass (g)").fill("heavy");
  await observations.getByLabel("Open-circuit voltage (V)").fill("0");
  await before.getByTestId("current-step-form").getByRole("button", { name: "Save the step" }).click();
  await expect(observations.getByText("write a number")).toBeVisible();
  await before.screenshot({ path: test.info().outputPath("operator-form-refused.png") });
  await page.reload();

  await recordLine(page, "before#1", async (form) => {
    await form.getByLabel("Mass (g)").fill("45.000");
    await form.getByLabel("Open-circuit voltage (V)").fill("3.600");
    await form.getByLabel("Diameter or thickness (mm)").fill("21.10");
    await form.getByLabel("Height (mm)").fill("70.20");
    for (const outcome of ["No leakage", "No venting", "No disassembly", "No rupture", "No fire"]) await form.getByLabel(outcome).check();
  });
  await expect(before).toContainText("Mass: 45.000 g");
  await recordLine(page, "storage#1", async () => {});
  await recordLine(page, "after#1", async (form) => {
    await form.getByLabel("Mass (g)").fill("44.91");
    await form.getByLabel("Open-circuit voltage (V)").fill("3.24");
    await form.getByLabel("Diameter or thickness (mm)").fill("21.10");
    await form.getByLabel("Height (mm)").fill("70.20");
    for (const outcome of ["No leakage", "No venting", "No disassembly", "No fire"]) await form.getByLabel(outcome).check();
  });
  await expect(page.getByTestId("step-line-after#1")).toContainText("not confirmed: no rupture");
  await before.screenshot({ path: test.info().outputPath("operator-before-done.png") });

  await page.goto(`${runUrl}/results`);
  // The button answers once the page is hydrated: press it until the evaluation shows.
  const section = page.getByTestId("observations");
  await expect(async () => {
    await page.getByRole("button", { name: "Evaluate again" }).click();
    await expect(section).toBeVisible({ timeout: 10_000 });
  }).toPass({ timeout: 60_000 });
  const rows = section.getByTestId("observation-criterion");
  await expect(rows.filter({ hasText: "mass loss" })).toContainText("45.000 g before, 44.910 g after: a loss of 0.200 %");
  await expect(rows.filter({ hasText: "mass loss" })).toContainText("conforms");
  await expect(rows.filter({ hasText: "open-circuit voltage" })).toContainText("90.000 %");
  await expect(rows.filter({ hasText: "visual state" })).toContainText("does not conform");
  await expect(section).toContainText("UN Manual of Tests and Criteria 38.3.4");
  await section.screenshot({ path: test.info().outputPath("results-observations.png") });

  // No data log is asked for before submitting.
  await page.goto(runUrl);
  await expect(page.getByTestId("submit-run")).not.toContainText("No data log");
});

test("an engineer drafts from the observation template and sees its criteria as fields", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "engineer");
  await page.goto("/procedures/new");
  await page.getByRole("radio", { name: /Observation before and after storage/ }).check();
  await page.getByLabel("Code of the new procedure").fill(`OBS-${Date.now() % 100000}`);
  await page.getByRole("button", { name: "Create draft" }).click();
  await expect(page).toHaveURL(/\/procedures\/[0-9a-f-]+\/versions\/1\/edit$/);
  const after = page.getByRole("region", { name: /Step 3/ });
  await after.getByRole("button", { name: "Edit fields of step 3" }).click();
  await expect(after.getByLabel("Band 2: up to (g)")).toHaveValue("75");
  await expect(after.getByLabel("largest loss (%)").nth(2)).toHaveValue("0.1");
  await expect(after.getByLabel("Open-circuit voltage after at least (% of before)")).toHaveValue("90");
  await expect(after.getByLabel("No rupture")).toBeChecked();
  // A criterion without what it judges is refused in words.
  await after.getByLabel("mass (g)", { exact: true }).uncheck();
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByText("the mass-loss criterion needs this step to record the mass").first()).toBeVisible();
  await after.screenshot({ path: test.info().outputPath("editor-observation-step.png") });
});
