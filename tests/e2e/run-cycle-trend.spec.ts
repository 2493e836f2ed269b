import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";

// The seed gives HV30-ENG-02 a run whose log holds 250 cycles of an invented fade (scripts/seed-endurance-trend.ts).
test("a run with cycles shows its capacity retention per cycle, drawn and listed", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "engineer");
  await page.goto("/runs");
  await page.getByRole("row").filter({ hasText: "HV30-ENG-02" }).getByRole("link").first().click();
  await page.getByRole("link", { name: "Findings and results" }).click();
  const trend = page.getByTestId("cycle-trend");
  await expect(trend.getByRole("img", { name: "Capacity retention per cycle, as a share of rated capacity" }).locator("canvas")).toBeVisible();
  await expect(trend).toContainText("3 000 mAh");
  // The latest cycle first; 250 cycles in all, and each row a share of rated between 80 % and 100 %.
  const rows = page.getByTestId("cycle-table").locator("tbody tr");
  await expect(rows).toHaveCount(10);
  await expect(rows.first()).toContainText("250");
  await expect(trend).toContainText("The latest 10 of 250 cycles");
  await expect(rows.nth(1)).toContainText(/8\d\.\d %/);
});
