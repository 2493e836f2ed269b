import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";

test("an operator registers a specimen in the demo lot; a cell of another specification is refused", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "operator");
  await page.goto("/lots");
  await page.getByRole("link", { name: "KV48-2611-A" }).click();
  await expect(page.getByRole("heading", { name: "Lot KV48-2611-A" })).toBeVisible();
  const before = Number(await page.getByTestId("specimen-count").textContent());
  await page.getByRole("link", { name: "Register a specimen of this lot" }).click();

  const form = page.getByRole("form", { name: "Specimen" });
  // Started from the lot: the lot, its cell specification and its receipt date are filled in.
  await expect(form.getByLabel("Lot")).toHaveValue(/[0-9a-f-]{36}/);
  await expect(form.getByLabel("Cell specification")).toContainText("Korvel Energy KV-21N48");
  const identifier = `KV48-2611-A-E${Date.now() % 100000}`;
  await form.getByLabel("Specimen identifier").fill(identifier);
  await form.getByLabel("Condition on receipt").fill("as received: sleeve intact, no dents, no leakage");

  // Bad input first: a cell of another specification does not belong in this lot.
  await form.getByLabel("Cell specification").selectOption({ label: "Halden Voltaic HV-18N30 (INR19/66)" });
  await form.getByRole("button", { name: "Save specimen" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Lot KV48-2611-A holds Korvel Energy KV-21N48 cells, not Halden Voltaic HV-18N30" })).toBeVisible();
  await expect(form.getByLabel("Specimen identifier")).toHaveValue(identifier);

  await form.getByLabel("Cell specification").selectOption({ label: "Korvel Energy KV-21N48 (INR22/71)" });
  await form.getByRole("button", { name: "Save specimen" }).click();

  await expect(page.getByRole("heading", { name: `Specimen ${identifier}` })).toBeVisible();
  await expect(page.getByRole("link", { name: "Korvel Energy KV-21N48" })).toBeVisible();
  await page.getByRole("link", { name: "KV48-2611-A" }).click();
  await expect(page.getByRole("heading", { name: "Lot KV48-2611-A" })).toBeVisible();
  await expect(page.getByTestId("specimen-count")).toHaveText(String(before + 1));
  await expect(page.getByRole("link", { name: identifier })).toBeVisible();

  // The list's search lives in the URL.
  await page.goto(`/specimens?q=${identifier}`);
  await expect(page.getByRole("link", { name: identifier })).toBeVisible();
  await expect(page.getByRole("link", { name: "HV30-ENG-01" })).toHaveCount(0);
  await page.goto("/specimens?q=HV30-ENG");
  await expect(page.getByRole("link", { name: /^HV30-ENG-0[12]$/ })).toHaveCount(2);
});

test("an auditor reads lots and specimens without controls to change them", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "auditor");
  await page.goto("/specimens");
  await page.getByRole("link", { name: "HV30-ENG-01" }).click();
  await expect(page.getByText("none: a loose specimen")).toBeVisible();
  await expect(page.getByRole("link", { name: "Edit specimen" })).toHaveCount(0);
  await page.goto("/lots");
  await expect(page.getByRole("link", { name: "Register a lot" })).toHaveCount(0);
  expect((await page.goto("/specimens/new"))?.status()).toBe(403);
});
