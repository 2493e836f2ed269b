import { readFile } from "node:fs/promises";
import Papa from "papaparse";
import { expect, test, type Page } from "@playwright/test";
import { DEMO_LOT_B } from "../../scripts/demo-lot-scenario";
import { signInAs } from "./fixtures";

/** The seeded second lot (scripts/demo-lot-scenario.ts): 13 cells drawn for the 0.2 It test, three more run at four rates. */
const RATE_CURRENTS = 4;
const AT_REFERENCE = DEMO_LOT_B.sampledModelCapacityMah.length + DEMO_LOT_B.rateCells.length;
const ALL_RESULTS = DEMO_LOT_B.sampledModelCapacityMah.length + DEMO_LOT_B.rateCells.length * RATE_CURRENTS;

async function openLotStatistics(page: Page): Promise<string> {
  await page.goto("/lots");
  await page.getByRole("link", { name: DEMO_LOT_B.identifier, exact: true }).click();
  await expect(page.getByRole("heading", { name: `Lot ${DEMO_LOT_B.identifier}`, exact: true })).toBeVisible();
  const statistics = `${new URL(page.url()).pathname}/statistics`;
  await page.goto(statistics);
  await expect(page.getByRole("heading", { name: `Lot ${DEMO_LOT_B.identifier}: statistics` })).toBeVisible();
  return statistics;
}

/** The figures of a statistics row as numbers: n, mean, s, min, max. */
async function readRow(page: Page, section: ReturnType<Page["getByTestId"]>, quantity: string): Promise<number[]> {
  const cells = await section.getByRole("row", { name: new RegExp(`^${quantity.replace(/[()]/g, "\\$&")}`) }).getByRole("cell").allTextContents();
  return cells.slice(0, 5).map((t) => Number(t.replace(/\s/g, "").replace("\u2212", "-")));
}

test("an engineer reads the demo lot's statistics, its rate capability, and overlays two discharges", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "engineer");
  await openLotStatistics(page);

  const reference = page.getByTestId("current-statistics").filter({ has: page.getByRole("heading", { name: /^At 0\.2 It/ }) });
  await expect(reference).toHaveCount(1);
  const [n, mean, , min, max] = await readRow(page, reference, "Capacity (mAh)");
  expect(n).toBe(AT_REFERENCE);
  expect(min).toBeLessThanOrEqual(mean!);
  expect(mean).toBeLessThanOrEqual(max!);
  // The invented cells deliver about 4 880 mAh to 5 060 mAh at 0.2 It: all above the rated 4 850 mAh.
  expect(min).toBeGreaterThan(4850);
  await expect(reference.getByText(`${AT_REFERENCE} of ${AT_REFERENCE} (100 %) at or above 4 850 mAh`)).toBeVisible();
  await expect(reference.getByText(/^\d+\.\d{2}; 0 below the minimum$/)).toBeVisible();

  // The histogram holds every result at 0.2 It, with its axis named and its unit.
  const histogram = reference.getByTestId("capacity-histogram").getByRole("img");
  const label = (await histogram.getAttribute("aria-label")) ?? "";
  expect(label).toMatch(/^Histogram of capacity \(mAh\)/);
  const counted = [...label.matchAll(/mAh: (\d+)/g)].reduce((sum, m) => sum + Number(m[1]), 0);
  expect(counted).toBe(AT_REFERENCE);
  await expect(reference.getByTestId("capacity-histogram").getByText("Capacity (mAh)")).toBeVisible();

  // A current with a single result says so instead of computing statistics.
  await expect(page.getByText("Statistics at this current need at least two results; there is only one.")).toBeVisible();

  const rate = page.getByTestId("rate-capability-table");
  await expect(rate.getByRole("row")).toHaveCount(1 + RATE_CURRENTS + 1 + 1); // head, rates, the 10.2 A row and its reason
  await expect(rate.getByText("0.2 (reference)")).toBeVisible();
  await expect(rate.getByTestId("above-rating")).toHaveCount(1);
  await expect(rate.getByText(/Above the rating: 1 of 1 result flagged on the run/)).toBeVisible();

  await page.getByRole("link", { name: "Overlay this lot's discharges" }).click();
  await expect(page.getByRole("heading", { name: "Compare discharges" })).toBeVisible();
  const list = page.getByTestId("discharge-list");
  await list.getByRole("checkbox").nth(0).check();
  await list.getByRole("checkbox").nth(1).check();
  await page.getByRole("button", { name: "Overlay the ticked discharges" }).click();
  await expect(page).toHaveURL(/[?&]d=R-\d+\.[\w-]+\.1.*&d=R-\d+\.[\w-]+\.1/);
  await expect(page.getByTestId("overlay-plot").locator("canvas").first()).toBeVisible();
  const legend = page.getByTestId("overlay-legend");
  await expect(legend.getByRole("row")).toHaveCount(3);
  await expect(legend.getByRole("row").nth(1)).toContainText(/R-\d{5}.*KV48-2612-B-\d{2}.*It \(\d\.\d{3} A\)/);

  // The address carries the choice: opened again, it shows the same overlay.
  const shared = page.url();
  await page.goto(shared);
  await expect(page.getByTestId("overlay-legend").getByRole("row")).toHaveCount(3);

  // The preset of one specimen at several currents draws one curve per rate.
  await page.getByTestId("preset-one-specimen").getByRole("link", { name: "Overlay these" }).click();
  await expect(page.getByTestId("overlay-legend").getByRole("row")).toHaveCount(1 + RATE_CURRENTS);
  await expect(page.getByTestId("overlay-plot").locator("canvas").first()).toBeVisible();
});

test("an auditor opens the lot's statistics and downloads its results as CSV", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "auditor");
  await openLotStatistics(page);
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "results as CSV" }).click()]);
  expect(download.suggestedFilename()).toBe(`${DEMO_LOT_B.identifier}-results.csv`);
  const csv = await readFile((await download.path())!, "utf8");
  const [header, ...rows] = Papa.parse<string[]>(csv.trim()).data;
  expect(header).toContain("capacity (mAh)");
  expect(rows).toHaveLength(ALL_RESULTS);
  const col = (name: string) => header!.indexOf(name);
  const atReference = rows.filter((r) => Number(r[col("current (× It)")]) === 0.2);
  expect(atReference).toHaveLength(AT_REFERENCE);
  expect(rows.filter((r) => r[col("above the rating")] === "yes")).toHaveLength(1);
  expect(new Set(rows.map((r) => r[col("reviewed status")]))).toEqual(new Set(["accepted"]));

  // The page's mean at 0.2 It is the mean of the exported capacities.
  const mean = atReference.reduce((sum, r) => sum + Number(r[col("capacity (mAh)")]), 0) / atReference.length;
  const reference = page.getByTestId("current-statistics").filter({ has: page.getByRole("heading", { name: /^At 0\.2 It/ }) });
  const [, shown] = await readRow(page, reference, "Capacity (mAh)");
  expect(Math.abs(shown! - mean)).toBeLessThanOrEqual(0.5 + 0.05);
});
