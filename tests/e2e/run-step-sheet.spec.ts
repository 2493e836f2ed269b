import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";

async function chooseOption(select: import("@playwright/test").Locator, text: string): Promise<void> {
  const value = await select.locator("option", { hasText: text }).first().getAttribute("value");
  expect(value, `an option containing "${text}"`).toBeTruthy();
  await select.selectOption(value!);
}

test("an operator starts a run of TPL-RC20, stamps the first step, records the ambient, ticks it and moves to the next step", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "operator");
  await page.goto("/runs");
  await page.getByRole("link", { name: "Start a run" }).click();

  await chooseOption(page.getByLabel("Procedure version (released)"), "TPL-RC20");
  await chooseOption(page.getByLabel("Specimen"), "KV48-2611-A-002");
  await page.getByRole("checkbox", { name: /cycler channel CY1-CH01/ }).check();
  // The ambient is read on the run's thermometer (or the climate chamber where the seed has no thermometer).
  await page.getByRole("checkbox", { name: /^(thermometer|climate chamber) / }).first().check();
  await page.getByRole("button", { name: "Start the run" }).click();

  await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
  await expect(page.getByTestId("run-status")).toHaveText(/planned/);
  const first = page.getByTestId("step-line-precondition#1");
  await expect(first).toHaveAttribute("data-state", "current");
  await expect(page.getByTestId("step-line-charge#1")).toHaveAttribute("data-state", "waiting");
  // The frozen set-point shows where it came from.
  await expect(first.getByText(/0\.2 × It = .* A from rated/)).toBeVisible();

  await first.getByRole("button", { name: "Mark start" }).click();
  await expect(first.getByTestId("step-started-at")).toBeVisible();
  await expect(page.getByTestId("run-status")).toHaveText(/in progress/);

  // A tick without an ambient reading is refused next to the reading.
  const form = first.getByTestId("current-step-form");
  await form.getByLabel("Step carried out: tick it off").check();
  await form.getByRole("button", { name: "Save the step" }).click();
  await expect(form.getByText("record at least one ambient reading before ticking the step")).toBeVisible();
  await expect(first).toHaveAttribute("data-state", "current");

  // The refused form keeps what was typed; save the reading first without the tick, while the step runs.
  await form.getByLabel("Step carried out: tick it off").uncheck();
  await form.getByLabel("Reading (°C)").fill("21.4");
  await form.getByLabel("Discharge current (A)").fill("0.97");
  await form.getByRole("button", { name: "Save the step" }).click();
  await expect(first.getByTestId("recorded-readings")).toContainText("21.4 °C");

  await first.getByRole("button", { name: "Mark end" }).click();
  await expect(first.getByTestId("step-ended-at")).toBeVisible();
  await first.getByTestId("current-step-form").getByLabel("Step carried out: tick it off").check();
  await first.getByTestId("current-step-form").getByRole("button", { name: "Save the step" }).click();
  await expect(first).toHaveAttribute("data-state", "done");
  await expect(first).toContainText("21.4 °C");
  await expect(first).toContainText("Discharge current 0.97 A");
  await expect(page.getByTestId("step-line-charge#1")).toHaveAttribute("data-state", "current");
  await expect(page.getByTestId("step-line-charge#1").getByRole("button", { name: "Mark start" })).toBeVisible();
});

test("an auditor reads the step sheet without any control to record", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "auditor");
  await page.goto("/runs");
  await page.getByRole("link", { name: /^R-\d{5}$/ }).first().click();
  await expect(page.getByText("Your role reads runs; only an operator records steps.")).toBeVisible();
  await expect(page.getByRole("button", { name: "Mark start" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Save the step" })).toHaveCount(0);
});
