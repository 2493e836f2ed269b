import { randomBytes } from "node:crypto";
import { expect, test } from "@playwright/test";
import pg from "pg";
import { signInAs, signInAsUser } from "./fixtures";
import { DEMO_USERS } from "@/scenarios/demo-lab";

// The second engineer, who releases: the demo account's own password.
const RELEASER_PASSWORD = DEMO_USERS.find((u) => u.email === "engineer2@brackwater.example")!.password;

async function withDb<T>(work: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    return await work(c);
  } finally {
    await c.end();
  }
}

/**
 * A procedure of its own, as two engineers left it: version 1 released, version 2 (the discharge raised
 * to 3 It, its caution acknowledged by the author) submitted for review by Dana Okafor.
 */
async function procedureWaitingForRelease(code: string): Promise<void> {
  await withDb(async (c) => {
    const ids = Object.fromEntries(
      (await c.query<{ email: string; id: string }>("select email, id from app_user where email in ('engineer@brackwater.example', 'engineer2@brackwater.example')")).rows.map((r) => [r.email, r.id]),
    );
    const author = ids["engineer@brackwater.example"];
    const releaser = ids["engineer2@brackwater.example"];
    const src = (
      await c.query<{ definition: { header: { code: string }; steps: { id: string; current?: unknown }[] }; title: string }>(
        `select v.definition, v.title from procedure_version v join procedure p on p.id = v.procedure_id where p.code = 'TPL-RC20' and v.status = 'released' limit 1`,
      )
    ).rows[0]!;
    const v1 = { ...src.definition, header: { ...src.definition.header, code } };
    const v2 = structuredClone(v1);
    v2.steps.find((s) => s.id === "discharge")!.current = { multipleOfIt: 3 };
    const proc = (await c.query<{ id: string }>("insert into procedure (code, created_by) values ($1, $2) returning id", [code, author])).rows[0]!.id;
    await c.query(
      `insert into procedure_version (procedure_id, number, status, title, definition, author_id, submitted_by, submitted_at, released_by, released_at, updated_at)
       values ($1, 1, 'released', $2, $3, $4, $4, now() - interval '2 days', $5, now() - interval '2 days', now() - interval '3 days')`,
      [proc, src.title, JSON.stringify(v1), author, releaser],
    );
    await c.query(
      `insert into procedure_version (procedure_id, number, status, title, definition, acknowledged_cautions, author_id, submitted_by, submitted_at, updated_at)
       values ($1, 2, 'in_review', $2, $3, $4, $5, $5, now(), now() - interval '1 hour')`,
      [proc, src.title, JSON.stringify(v2), JSON.stringify(["discharge-current-above-rating/discharge/current"]), author],
    );
  });
}

test("home pages show each role what waits for it, and a version waiting for release is signed off from the queue", async ({ browser, baseURL }) => {
  test.setTimeout(90_000);
  const code = `Q-${randomBytes(3).toString("hex").toUpperCase()}`;
  await procedureWaitingForRelease(code);

  // The author sees no queue entry for their own version; the "not built yet" box is gone.
  const author = await browser.newContext();
  await signInAs(author, baseURL!, "engineer");
  const authorPage = await author.newPage();
  await authorPage.goto("/");
  await expect(authorPage.getByTestId("release-queue")).toBeVisible();
  await expect(authorPage.getByTestId("release-queue")).not.toContainText(code);
  await expect(authorPage.getByText("Not built yet")).toHaveCount(0);
  await expect(authorPage.getByTestId("certify-queue")).toBeVisible();
  // The review queue pages 25 at a time, the longest-waiting run first: page 1 holds the first 25 in that order.
  const submitted = await withDb(async (c) => (await c.query<{ number: string }>("select number from run where status = 'submitted' order by submitted_at, number")).rows.map((r) => r.number));
  expect(submitted.length, "the seed leaves runs waiting for review").toBeGreaterThan(0);
  const reviewQueue = authorPage.getByTestId("review-queue");
  await expect(reviewQueue.getByRole("heading")).toContainText(`(${submitted.length})`);
  await expect(reviewQueue.locator("tbody tr")).toHaveCount(Math.min(submitted.length, 25));
  expect(await reviewQueue.locator("tbody tr td:first-child").allInnerTexts()).toEqual(submitted.slice(0, 25));
  await expect(reviewQueue.getByTestId("pager")).toContainText(`Page 1 of ${Math.ceil(submitted.length / 25)}`);

  // The second engineer releases it from the queue, after reading its caution and its changes.
  const second = await browser.newContext();
  await signInAsUser(second, baseURL!, "engineer2@brackwater.example");
  const page = await second.newPage();
  await page.goto("/");
  const queue = page.getByTestId("release-queue");
  await expect(queue).toContainText(`${code} version 2`);
  await queue.getByRole("link", { name: `Read and release ${code} version 2` }).click();
  await expect(page.getByRole("heading", { name: `Release ${code} version 2` })).toBeVisible();
  await expect(page.getByTestId("release-cautions")).toHaveText(/Step \d+ “Capacity discharge at 0\.2 It”, current: set above the cell's maximum continuous discharge current/);
  await expect(page.getByRole("heading", { name: "What changed since version 1" })).toBeVisible();
  await expect(page.getByTestId("step-discharge")).toContainText("changed: current › multiple of It");
  await expect(page.getByTestId("step-discharge")).toContainText("3 It");
  const password = page.getByLabel("Your password, to sign");
  await password.fill("wrong-password");
  await page.getByRole("button", { name: "Sign and release version 2" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "That password is not right. Nothing was signed." })).toBeVisible();
  await expect(password).toHaveValue("");
  await password.fill(RELEASER_PASSWORD);
  await page.getByRole("button", { name: "Sign and release version 2" }).click();
  await expect(page.getByTestId("signature-manifestation")).toContainText("Released by Tomas Lindqvist");
  await page.goto("/");
  await expect(page.getByTestId("release-queue")).not.toContainText(code);

  // Released with a signature; version 1 superseded; the author's last-saved time is still an hour ago.
  const stored = await withDb(async (c) =>
    (
      await c.query<{ number: number; status: string; meaning: string | null; saved_before_release: boolean }>(
        `select v.number, v.status, s.meaning, v.updated_at < v.released_at - interval '30 minutes' as saved_before_release
         from procedure_version v join procedure p on p.id = v.procedure_id
         left join electronic_signature s on s.entity_id = v.id and s.entity_type = 'procedure-version'
         where p.code = $1 order by v.number`,
        [code],
      )
    ).rows,
  );
  expect(stored).toEqual([
    { number: 1, status: "withdrawn", meaning: null, saved_before_release: true },
    { number: 2, status: "released", meaning: "released", saved_before_release: true },
  ]);

  // The operator's home: their own open runs, and the returned ones (each with the next thing to do).
  const operator = await browser.newContext();
  await signInAs(operator, baseURL!, "operator");
  const opPage = await operator.newPage();
  await opPage.goto("/");
  const mine = await withDb(async (c) =>
    (
      await c.query<{ number: string; status: string }>(
        `select r.number, r.status from run r join app_user u on u.id = r.operator_id where u.email = 'operator@brackwater.example' and r.status in ('planned', 'in_progress', 'returned')`,
      )
    ).rows,
  );
  expect(mine.length, "the seed leaves the operator a planned run").toBeGreaterThan(0);
  for (const r of mine) {
    const where = r.status === "returned" ? "returned-queue" : "open-runs-queue";
    await expect(opPage.getByTestId(where)).toContainText(r.number);
  }
  await expect(opPage.getByTestId("open-runs-queue").getByRole("link", { name: /^Continue run R-/ }).first()).toBeVisible();
  await expect(opPage.getByTestId("release-queue")).toHaveCount(0);

  await Promise.all([author.close(), second.close(), operator.close()]);
});
