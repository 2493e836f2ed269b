import { expect, test } from "@playwright/test";
import { tinyPdf } from "../support/tiny-pdf";
import { signInAs } from "./fixtures";

test("an engineer registers a cell, sees its IEC 61960 designation, and attaches its datasheet; a bad file is refused", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "engineer");
  await page.goto("/specs");
  await page.getByRole("link", { name: "New specification" }).click();
  const form = page.getByRole("form", { name: "Cell specification" });
  const model = `QA-21N50-${Date.now()}`;
  await form.getByLabel("Maker", { exact: true }).fill("Quillon Test Cells");
  await form.getByLabel("Model", { exact: true }).fill(model);
  await form.getByLabel("Chemistry as the maker names it", { exact: true }).fill("NMC");
  await form.getByLabel("Rated capacity (mAh)", { exact: true }).fill("5000");
  await form.getByLabel("Nominal voltage (V)", { exact: true }).fill("3,6");
  await form.getByLabel("Charge voltage (V)", { exact: true }).fill("4.2");
  await form.getByLabel("Standard charge current (A)", { exact: true }).fill("1.5");
  await form.getByLabel("Maximum continuous discharge current (A)", { exact: true }).fill("10");
  await form.getByLabel("End-of-discharge voltage (V)", { exact: true }).fill("2.5");
  await form.getByLabel("Maximum diameter (cylindrical) (mm), optional", { exact: true }).fill("21.4");
  await form.getByLabel("Maximum height (mm)", { exact: true }).fill("70.3");
  // IEC 61960 5.1 rounds the maximum dimensions up: Ø 21.4 × 70.3 → 22/71 (docs/references.md §11).
  await expect(form.getByTestId("designation")).toHaveText("INR22/71");

  // Bad input first: an end-of-discharge voltage above the nominal voltage is refused next to its field.
  await form.getByLabel("End-of-discharge voltage (V)", { exact: true }).fill("3.9");
  await form.getByRole("button", { name: "Save specification" }).click();
  await expect(form.getByText(/must be below the nominal voltage/)).toBeVisible();
  await form.getByLabel("End-of-discharge voltage (V)", { exact: true }).fill("2.5");
  await form.getByRole("button", { name: "Save specification" }).click();

  await expect(page.getByRole("heading", { name: `Quillon Test Cells ${model}` })).toBeVisible();
  await expect(page.getByText(/Designation INR22\/71/)).toBeVisible();
  // It = 5 000 mAh / 1 h = 5 A and 0.2 It = 1.0 A (IEC 61434; docs/references.md §1 table).
  await expect(page.getByTestId("it")).toHaveText("5 A");
  await expect(page.getByTestId("it-0.2")).toHaveText("1 A");

  const upload = page.getByLabel("Datasheet (PDF, at most 10 MB)");
  await upload.setInputFiles({ name: "photo.png", mimeType: "image/png", buffer: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a]) });
  await page.getByRole("button", { name: "Upload datasheet" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "is not a PDF" })).toBeVisible();
  await expect(page.getByText("No datasheet on file.")).toBeVisible();

  await upload.setInputFiles({ name: "quillon-datasheet.pdf", mimeType: "application/pdf", buffer: Buffer.from(await tinyPdf("Quillon datasheet")) });
  await page.getByRole("button", { name: "Upload datasheet" }).click();
  await expect(page.getByRole("link", { name: "quillon-datasheet.pdf" })).toBeVisible();
  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "quillon-datasheet.pdf" }).click();
  expect((await download).suggestedFilename()).toBe("quillon-datasheet.pdf");
});

test("an operator reads cell specifications but cannot change them", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "operator");
  await page.goto("/specs");
  await expect(page.getByRole("link", { name: "Korvel Energy KV-21N48" })).toBeVisible();
  await expect(page.getByRole("link", { name: "New specification" })).toHaveCount(0);
  await page.getByRole("link", { name: "Korvel Energy KV-21N48" }).click();
  await expect(page.getByRole("heading", { name: "Korvel Energy KV-21N48" })).toBeVisible();
  await expect(page.getByText(/Designation INR22\/71/)).toBeVisible();
  await expect(page.getByRole("link", { name: "kv-21n48-datasheet.pdf" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Edit values" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Upload datasheet" })).toHaveCount(0);
});
