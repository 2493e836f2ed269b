import { expect, test } from "@playwright/test";
import { addDays, toCalendarDate } from "../../lib/instruments/calendar-date";
import { signInAs } from "./fixtures";

// The browser and the server run on one machine, so they share the calendar day.
const today = toCalendarDate(new Date());

test("an admin registers a thermometer due in 12 days and sees it marked due soon", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "admin");
  await page.goto("/instruments");
  await page.getByRole("link", { name: "Register an instrument" }).click();
  const form = page.getByRole("form", { name: "Instrument" });
  const identifier = `TH-${Date.now() % 100000}`;

  // The accuracy asked for follows the kind: a thermometer states a temperature limit, not a current.
  await expect(form.getByLabel("Current: % of reading")).toBeVisible();
  await form.getByLabel("Kind").selectOption({ label: "thermometer" });
  await expect(form.getByLabel("Current: % of reading")).toBeHidden();
  await form.getByLabel("Identifier (the lab's label)").fill(identifier);
  await form.getByLabel("Serial number").fill("PT-4410-339");
  await form.getByLabel("Temperature: limit (± °C)").fill("0,2");
  await form.getByLabel("Calibration certificate number").fill("KAL-26-0071");

  // Bad input first: a due date before the calibration date is refused next to its field, and nothing typed is lost.
  const calibratedOn = addDays(today, -353);
  await form.getByLabel("Calibrated on").fill(calibratedOn);
  await form.getByLabel("Calibration due on").fill(addDays(calibratedOn, -1));
  await form.getByRole("button", { name: "Save instrument" }).click();
  await expect(form.getByText("The due date must be after the calibration date.")).toBeVisible();
  await expect(form.getByLabel("Identifier (the lab's label)")).toHaveValue(identifier);

  const dueOn = addDays(today, 12);
  await form.getByLabel("Calibration due on").fill(dueOn);
  await form.getByRole("button", { name: "Save instrument" }).click();

  await expect(page).toHaveURL(/\/instruments$/);
  const row = page.getByTestId(`instrument-${identifier}`);
  await expect(row).toContainText("due soon");
  await expect(row).toContainText("falls due within 30 days: in 12 days");
  await expect(row).toContainText("Temperature ±0.2 °C");
  await expect(row).toContainText(dueOn);
  await expect(page.getByText(`${identifier} (due on ${dueOn})`)).toBeVisible();
  // Due-soon instruments are listed before the valid ones.
  const order = await page.locator("tbody tr").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-testid")));
  expect(order.indexOf(`instrument-${identifier}`)).toBeLessThan(order.indexOf("instrument-CY1-CH01"));

  // Taken out of use, it stays in the register below the instruments in use, and can be put back.
  await row.getByRole("button", { name: `Take ${identifier} out of use` }).click();
  await expect(page.getByRole("status").filter({ hasText: `${identifier} is out of use` })).toBeVisible();
  await expect(row).toContainText("out of use");
  await expect(row.getByRole("button", { name: `Put ${identifier} back into use` })).toBeVisible();
  await expect(page.locator("tbody tr").last()).toHaveAttribute("data-testid", `instrument-${identifier}`);
  await page.goto("/instruments?inuse=1");
  await expect(page.getByTestId("instrument-CY1-CH01")).toBeVisible();
  await expect(page.getByTestId(`instrument-${identifier}`)).toHaveCount(0);
});

test("an auditor reads the instrument register but has no controls to change it", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "auditor");
  await page.goto("/instruments");
  await expect(page.getByRole("heading", { name: "Instruments" })).toBeVisible();
  await expect(page.getByTestId("instrument-CY1-CH02")).toContainText("due soon");
  await expect(page.getByTestId("instrument-CY1-CH01")).toContainText("valid");
  await expect(page.getByTestId("instrument-CY1-CH01")).toContainText("Current ±(0.02 % of reading + 0.02 % of 10 A range)");
  await expect(page.getByRole("link", { name: "Register an instrument" })).toHaveCount(0);
  await expect(page.getByRole("link", { name: /^Edit/ })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /out of use|back into use/ })).toHaveCount(0);
  expect((await page.goto("/instruments/new"))?.status()).toBe(403);
});
