import pg from "pg";
import { expect, signInAsUser, test } from "./fixtures";

// An operator of this spec's own, so the 30 runs it plans show under "Only runs I operated" and nowhere
// near the demo operator's queues; planned in 2020 so they sort after every demo run.
const FILLER = { id: "e2e-list-filler", email: "list.filler@lab.test", name: "Lis Filler" };
const RUNS = 30;

async function asOwner<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: process.env.E2E_OWNER_DATABASE_URL });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

test.beforeAll(async () => {
  await asOwner(async (c) => {
    await c.query(`insert into app_user (id, email, display_name, role, password_hash) values ($1, $2, $3, 'operator', 'no sign-in') on conflict (id) do nothing`, [
      FILLER.id,
      FILLER.email,
      FILLER.name,
    ]);
    const made = await c.query(
      `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source, created_at)
       select r.procedure_version_id, r.specimen_id, $1, r.resolution, r.cell_rating, r.procedure_source, timestamptz '2020-01-01 09:00Z' + g * interval '1 day'
       from (select * from run order by created_at limit 1) r, generate_series(1, ${RUNS}) g`,
      [FILLER.id],
    );
    if (made.rowCount !== RUNS) throw new Error("the e2e database has no run to copy");
  });
});

test.afterAll(async () => {
  await asOwner(async (c) => {
    // The participant rows the planned runs wrote are append-only; the owner lifts that guard for this
    // clean-up alone, inside one transaction, so the demo data the next specs read is as it was.
    await c.query("begin");
    await c.query("alter table run_participant disable trigger run_participant_append_only");
    await c.query(`delete from run_participant where run_id in (select id from run where operator_id = $1)`, [FILLER.id]);
    await c.query("alter table run_participant enable trigger run_participant_append_only");
    await c.query(`delete from run where operator_id = $1`, [FILLER.id]);
    await c.query(`delete from app_user where id = $1`, [FILLER.id]);
    await c.query("commit");
  });
});

test("the run list pages 25 at a time, sorts by a header and keeps the filter, and says when nothing matches", async ({ page, context, baseURL }) => {
  await signInAsUser(context, baseURL!, FILLER.email);
  await page.goto("/runs?mine=1");
  const rows = page.getByTestId("run-list").locator("tbody tr");
  const pager = page.getByTestId("pager");
  await expect(pager).toContainText("Page 1 of 2");
  await expect(pager).toContainText(`${RUNS} runs`);
  await expect(rows).toHaveCount(25);
  // Newest first by default: the run planned on 2020-01-31 heads the list.
  await expect(rows.first().locator("td").last()).toHaveText("2020-01-31");

  await pager.getByRole("link", { name: "Next page →" }).click();
  await expect(pager).toContainText("Page 2 of 2");
  await expect(rows).toHaveCount(RUNS - 25);
  await expect(rows.last().locator("td").last()).toHaveText("2020-01-02");
  expect(new URL(page.url()).searchParams.get("mine")).toBe("1");

  // Sorting starts again at page 1 and keeps the filter.
  await page.getByRole("columnheader", { name: /Planned on/ }).getByRole("link").click();
  await expect(page.getByRole("columnheader", { name: /Planned on/ })).toHaveAttribute("aria-sort", "ascending");
  await expect(pager).toContainText("Page 1 of 2");
  await expect(rows.first().locator("td").last()).toHaveText("2020-01-02");
  expect(new URL(page.url()).searchParams.get("mine")).toBe("1");

  await page.getByRole("columnheader", { name: /^Run/ }).getByRole("link").click();
  await expect(page.getByRole("columnheader", { name: /^Run/ })).toHaveAttribute("aria-sort", "ascending");
  const ascending = await rows.locator("td:first-child").allInnerTexts();
  expect(ascending).toEqual([...ascending].sort());
  await page.getByRole("columnheader", { name: /^Run/ }).getByRole("link").click();
  await expect(page.getByRole("columnheader", { name: /^Run/ })).toHaveAttribute("aria-sort", "descending");
  const descending = await rows.locator("td:first-child").allInnerTexts();
  expect(descending).toEqual([...descending].sort().reverse());
  expect(descending[0]! > ascending[0]!).toBe(true);

  // A filter that keeps nothing says so in words and shows no pager.
  await page.getByLabel("Status").selectOption({ label: "accepted" });
  await page.getByRole("button", { name: "Show" }).click();
  await expect(page.getByText("No runs match.")).toBeVisible();
  await expect(rows).toHaveCount(0);
  await expect(pager).toHaveCount(0);
  const url = new URL(page.url());
  expect(url.searchParams.get("sort")).toBe("number");
  expect(url.searchParams.get("dir")).toBe("desc");

  // An unknown sort in the address falls back to the default order instead of failing.
  await page.goto("/runs?mine=1&sort=password_hash&page=x");
  await expect(pager).toContainText("Page 1 of 2");
  await expect(rows.first().locator("td").last()).toHaveText("2020-01-31");
});

test("a home queue pages in place by its own address parameter", async ({ page, context, baseURL }) => {
  await signInAsUser(context, baseURL!, FILLER.email);
  await page.goto("/");
  const open = page.getByTestId("open-runs-queue");
  const rows = open.locator("tbody tr");
  await expect(open.getByRole("heading")).toContainText(`(${RUNS})`);
  await expect(rows).toHaveCount(25);
  await expect(open.getByTestId("pager")).toContainText("Page 1 of 2");
  // Each queue's pager has a name of its own for a screen reader, not one "Pages" landmark per queue.
  await expect(open.getByRole("navigation", { name: "Pages of your runs in progress" })).toBeVisible();
  // The returned queue beside it is empty and shows no pager of its own.
  await expect(page.getByTestId("returned-queue")).toContainText("No run of yours has been returned.");
  await expect(page.getByTestId("returned-queue").getByTestId("pager")).toHaveCount(0);

  const firstPage = await rows.locator("td:first-child").allInnerTexts();
  await open.getByRole("link", { name: "Next page →" }).click();
  await expect(open.getByTestId("pager")).toContainText("Page 2 of 2");
  await expect(rows).toHaveCount(RUNS - 25);
  const secondPage = await rows.locator("td:first-child").allInnerTexts();
  expect(secondPage.filter((n) => firstPage.includes(n)), "no run is on both pages").toEqual([]);
  const url = new URL(page.url());
  expect(url.pathname).toBe("/");
  expect(url.searchParams.get("open-runs-queue")).toBe("2");
  expect(url.searchParams.has("page")).toBe(false);

  await open.getByRole("link", { name: "← Previous page" }).click();
  await expect(open.getByTestId("pager")).toContainText("Page 1 of 2");
  expect(await rows.locator("td:first-child").allInnerTexts()).toEqual(firstPage);
});

test("the JSON run list answers 100 runs a page with the page, the page count and the total", async ({ page, context, baseURL }) => {
  // 100 more planned runs of the filler operator (the clean-up above removes them with the others).
  await asOwner((c) =>
    c.query(
      `insert into run (procedure_version_id, specimen_id, operator_id, resolution, cell_rating, procedure_source, created_at)
       select r.procedure_version_id, r.specimen_id, $1, r.resolution, r.cell_rating, r.procedure_source, timestamptz '2019-01-01 09:00Z' + g * interval '1 hour'
       from (select * from run order by created_at limit 1) r, generate_series(1, 100) g`,
      [FILLER.id],
    ),
  );
  const planned = await asOwner(async (c) => (await c.query<{ id: string }>("select id from run where status = 'planned' order by created_at desc, id")).rows.map((r) => r.id));
  expect(planned.length).toBeGreaterThan(100);
  await signInAsUser(context, baseURL!, FILLER.email);
  const read = async (query: string) => {
    const res = await page.request.get(`/api/runs?status=planned${query}`);
    expect(res.status()).toBe(200);
    return (await res.json()) as { page: number; pageCount: number; total: number; runs: { id: string; status: string }[] };
  };
  const first = await read("");
  expect({ page: first.page, pageCount: first.pageCount, total: first.total }).toEqual({ page: 1, pageCount: Math.ceil(planned.length / 100), total: planned.length });
  expect(first.runs.map((r) => r.id)).toEqual(planned.slice(0, 100));
  const second = await read("&page=2");
  expect(second.page).toBe(2);
  expect(second.runs.map((r) => r.id)).toEqual(planned.slice(100, 200));
  // A page past the end answers the last page; a page that is not a number answers the first.
  expect((await read("&page=999")).page).toBe(first.pageCount);
  expect((await read("&page=x")).runs.map((r) => r.id)).toEqual(planned.slice(0, 100));
});
