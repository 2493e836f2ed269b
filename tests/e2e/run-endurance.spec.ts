import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";
import { DEMO_ENDURANCE_RUN } from "@/scenarios/demo-lab";

// An engineer drafts from the endurance template (a bad number of cycles is refused in plain words), the
// operator's step sheet shows the cycle block as one line, and the demo endurance run's results show the
// capacity per cycle, the stop criterion and the acceptance statement with its decision rule.
test("an engineer drafts an endurance procedure; the demo endurance run shows its cycles and its acceptance statement", async ({ browser, baseURL }) => {
  test.setTimeout(120_000);
  const author = await browser.newContext();
  await signInAs(author, baseURL!, "engineer");
  const page = await author.newPage();
  await page.goto("/procedures/new");
  await page.getByRole("radio", { name: "Endurance in cycles" }).check();
  await page.getByLabel("Code of the new procedure").fill(`BW-END-${Date.now() % 100000}`);
  await page.getByRole("button", { name: "Create draft" }).click();
  await expect(page).toHaveURL(/\/procedures\/[0-9a-f-]+\/versions\/1\/edit$/);
  await page.locator('.ProseMirror[contenteditable="true"]').first().waitFor();

  const block = page.getByRole("region", { name: /Step 2/ });
  // A draft of two steps opens with every step's fields shown (steps-editor: startOpen up to two steps).
  await expect(block.getByRole("button", { name: "Hide fields of step 2" })).toHaveAttribute("aria-expanded", "true");
  // How each cycle's charge ends: after a set time asks for the time; back to a current limit asks for the current.
  const chargeEnds = block.getByLabel("The charge ends");
  await expect(chargeEnds).toHaveValue("current");
  await chargeEnds.selectOption({ label: "after a set time" });
  await expect(block.getByRole("group", { name: "Charge time", exact: true })).toBeVisible();
  await expect(block.getByRole("group", { name: "Termination current", exact: true })).toHaveCount(0);
  await chargeEnds.selectOption({ label: "when the current falls to a limit" });
  await expect(block.getByRole("group", { name: "Termination current", exact: true })).toBeVisible();
  const cycles = block.getByLabel("Number of cycles");
  await expect(cycles).toHaveValue("400");
  await cycles.fill("120");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "The draft was not saved" })).toBeVisible();
  await expect(page.getByText("must be a multiple of the capacity-check interval (50)").first()).toBeVisible();
  await cycles.fill("400");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("status").filter({ hasText: "saved as a draft" })).toBeVisible();

  // Resolved on the invented 3 000 mAh cell: 0.5 It = 1.5 A, 0.2 It = 0.6 A (IEC 61434); 60 % of rated = 1 800 mAh.
  const preview = page.getByTestId("procedure-preview");
  await preview.getByLabel("Cell specification").selectOption({ label: "Halden Voltaic HV-18N30 (INR19/66)" });
  const resolved = preview.getByTestId("resolved-step-cycles");
  await expect(resolved).toContainText("1.5 A");
  await expect(resolved).toContainText("0.6 A");
  await expect(resolved).toContainText("1 800 mAh");
  await block.screenshot({ path: test.info().outputPath("editor-cycle-block.png") });

  const operator = await browser.newContext();
  await signInAs(operator, baseURL!, "operator");
  const opPage = await operator.newPage();
  await opPage.goto("/runs?sort=specimen&dir=asc");
  await opPage.getByRole("row").filter({ hasText: DEMO_ENDURANCE_RUN.specimen }).getByRole("link").first().click();
  await expect(opPage).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
  const line = opPage.getByTestId("step-line-cycles#1");
  await expect(line).toContainText("Endurance cycles");
  await opPage.screenshot({ path: test.info().outputPath("operator-step-sheet.png"), fullPage: true });

  await opPage.goto(`${opPage.url()}/results`);
  const endurance = opPage.getByTestId("endurance");
  await expect(endurance).toBeVisible();
  const rows = endurance.getByTestId("endurance-cycle");
  // The first cycle, the capacity check at cycle 50 and the last of the 60 cycles in the log.
  await expect(rows.first()).toContainText("2 950 mAh");
  await expect(rows.filter({ hasText: "capacity check" })).toContainText("50");
  await expect(endurance).toContainText(`${DEMO_ENDURANCE_RUN.cycles} of 400`);
  await expect(endurance.getByTestId("endurance-stop")).toContainText("Not met so far");
  await expect(endurance.getByTestId("endurance-acceptance")).toContainText("not decided");
  await expect(endurance.getByTestId("endurance-acceptance")).toContainText("Decision rule: simple acceptance");
  await opPage.screenshot({ path: test.info().outputPath("results-endurance.png"), fullPage: true });
});
