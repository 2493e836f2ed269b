import { expect, test } from "@playwright/test";
import { openSession, demoUser, SESSION_COOKIE, signInAs } from "./fixtures";

test("an engineer registers a lot, sets its plan, draws the sample and registers a drawn cell; an operator reads the plan", async ({ page, context, baseURL, browser }) => {
  await signInAs(context, baseURL!, "engineer");
  const identifier = `KV48-E2E-${Date.now() % 1_000_000}`;

  await page.goto("/lots/new");
  const lotForm = page.getByRole("form", { name: "Lot" });
  await lotForm.getByLabel("Lot identifier").fill(identifier);
  await lotForm.getByLabel("Cell specification").selectOption({ label: "Korvel Energy KV-21N48 (INR22/71)" });
  await lotForm.getByLabel("Supplier").fill("Ashgrove Cell Supply");
  await lotForm.getByLabel("Customer, optional").fill("Quayside Packs Ltd");
  await lotForm.getByLabel("Quantity received (cells)").fill("60");
  await lotForm.getByLabel("Received on").fill(new Date(Date.now() - 86_400_000).toISOString().slice(0, 10));
  await lotForm.getByRole("button", { name: "Save lot" }).click();
  await expect(page.getByRole("heading", { name: `Lot ${identifier}` })).toBeVisible();
  await expect(page.getByText("Quayside Packs Ltd")).toBeVisible();
  const lotUrl = page.url();

  // Bad input first: the form offers only the table's AQLs, so a plan without one is refused with the field named.
  const planForm = page.getByRole("form", { name: "Sampling plan" });
  await planForm.getByRole("button", { name: "Set the plan" }).click();
  await expect(planForm.getByText("Choose the AQL")).toBeVisible();
  await expect(page.getByTestId("sampling-plan")).toHaveCount(0);

  await planForm.getByLabel("Inspection level").selectOption({ label: "General II (the usual level)" });
  await planForm.getByLabel("AQL (% nonconforming)").selectOption("1.0");
  await planForm.getByRole("button", { name: "Set the plan" }).click();
  // docs/references.md §10 [published]: lot 51–90 at AQL 1.0 → E, n = 13, Ac 0, Re 1.
  await expect(page.getByTestId("code-letter")).toHaveText("E");
  await expect(page.getByTestId("sample-size")).toHaveText("13 cells");
  await expect(page.getByTestId("acceptance-number")).toHaveText("0");
  await expect(page.getByTestId("rejection-number")).toHaveText("1");
  await expect(page.getByText("lot of 60 at level II → code letter E (Table 1)")).toBeVisible();
  await expect(page.getByTestId("lot-decision")).toContainText("Pending");
  await expect(page.getByTestId("lot-rule")).toContainText("Accept if at most 0 of the 13 cells sampled do not conform; reject as soon as 1 do");

  await page.getByRole("form", { name: "Draw at random" }).getByLabel("Seed, optional").fill("20261202");
  await page.getByRole("button", { name: "Draw 13 cells at random" }).click();
  const drawn = page.getByTestId("drawn-sample");
  await expect(drawn.locator("tbody tr")).toHaveCount(13);
  await expect(page.getByTestId("draw-summary")).toContainText("with seed 20261202");
  // Drawn once: the plan is fixed and no draw button remains.
  await expect(page.getByRole("button", { name: /Draw 13 cells/ })).toHaveCount(0);
  await expect(page.getByRole("form", { name: "Sampling plan" })).toHaveCount(0);

  const firstRow = drawn.locator("tbody tr").first();
  const position = (await firstRow.locator("th").textContent())!.trim();
  await firstRow.getByRole("link", { name: `Register the cell at tray position ${position}` }).click();
  const specimenForm = page.getByRole("form", { name: "Specimen" });
  await expect(specimenForm.getByLabel("Tray position, optional")).toHaveValue(position);
  const cell = `${identifier}-P${position}`;
  await specimenForm.getByLabel("Specimen identifier").fill(cell);
  await specimenForm.getByLabel("Condition on receipt").fill("as received: sleeve intact, no dents, no leakage");
  await specimenForm.getByRole("button", { name: "Save specimen" }).click();
  await expect(page.getByRole("heading", { name: `Specimen ${cell}` })).toBeVisible();

  await page.goto(lotUrl);
  await expect(drawn.locator("tbody tr").first().getByRole("link", { name: cell })).toBeVisible();
  await expect(page.getByTestId("lot-counts")).toContainText("Registered as specimens1 cell");

  // The operator reads the plan and the sample, with no form to change them.
  const operator = await browser.newContext();
  await signInAs(operator, baseURL!, "operator");
  const operatorPage = await operator.newPage();
  await operatorPage.goto(lotUrl);
  await expect(operatorPage.getByTestId("code-letter")).toHaveText("E");
  await expect(operatorPage.getByTestId("drawn-sample").locator("tbody tr")).toHaveCount(13);
  await expect(operatorPage.getByRole("form", { name: "Sampling plan" })).toHaveCount(0);
  await expect(operatorPage.getByRole("button", { name: /Draw .* at random/ })).toHaveCount(0);
  await operator.close();
});

test("the sampling plan API answers a plan, and 422 naming the field for an impossible one", async ({ playwright, baseURL }) => {
  const api = await playwright.request.newContext({
    baseURL,
    extraHTTPHeaders: { origin: baseURL!, cookie: `${SESSION_COOKIE}=${await openSession(demoUser("auditor").email)}` },
  });
  const ok = await api.post("/api/sampling-plan", { data: { lotSize: 400, inspectionLevel: "II", aql: "0.65" } });
  expect(ok.status()).toBe(200);
  // docs/references.md §10 [published]: lot 281–500 at AQL 0.65 → arrow down to J, n = 80, Ac 1, Re 2.
  expect((await ok.json()).plan).toMatchObject({ initialCodeLetter: "H", codeLetter: "J", sampleSize: 80, acceptanceNumber: 1, rejectionNumber: 2 });

  const badAql = await api.post("/api/sampling-plan", { data: { lotSize: 400, inspectionLevel: "II", aql: 0.7 } });
  expect(badAql.status()).toBe(422);
  const body = await badAql.json();
  expect(body.error.fields[0].path).toBe("aql");
  expect(body.error.fields[0].message).toMatch(/AQL 0\.7 is not a column of Table 2-A; choose one of/);

  const emptyLot = await api.post("/api/sampling-plan", { data: { lotSize: 0, inspectionLevel: "II", aql: 1 } });
  expect(emptyLot.status()).toBe(422);
  expect((await emptyLot.json()).error.fields[0].path).toBe("lotSize");
  await api.dispose();
});
