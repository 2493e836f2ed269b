import { request as http } from "node:http";
import pg from "pg";
import { expect, signInAs, test } from "./fixtures";

// Issue 11: what a probe of the production build found, each checked against the running app.

test("pages carry a nonce-based CSP, refuse framing and sniffing, and send no HSTS over plain http (row 9)", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "admin");
  const violations: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to (execute|load)/i.test(m.text())) violations.push(m.text());
  });
  const response = await page.goto("/admin/users");
  const headers = response!.headers();
  const csp = headers["content-security-policy"] ?? "";
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["referrer-policy"]).toBe("strict-origin-when-cross-origin");
  expect(headers["strict-transport-security"]).toBeUndefined();
  // Next's own scripts carry the nonce and run: the page is interactive.
  const nonce = /'nonce-([^']+)'/.exec(csp)![1]!;
  expect(await page.locator(`script[nonce]`).count()).toBeGreaterThan(0);
  expect(await page.locator("script[nonce]").first().evaluate((s) => (s as HTMLScriptElement).nonce)).toBe(nonce);
  await page.getByRole("link", { name: "Procedures" }).click();
  await expect(page).toHaveURL(/\/procedures$/);
  expect(violations).toEqual([]);
  // A second request gets another nonce.
  const again = await page.request.get("/admin/users");
  expect(again.headers()["content-security-policy"]).not.toContain(nonce);
});

test("unknown records answer 404, not 200 (row 11)", async ({ context, baseURL, page }) => {
  await signInAs(context, baseURL!, "engineer");
  for (const path of ["/procedures/00000000-0000-4000-8000-000000000000", "/lots/00000000-0000-4000-8000-000000000000", "/procedures/not-an-id", "/specs/00000000-0000-4000-8000-000000000000", "/specimens/00000000-0000-4000-8000-000000000000"]) {
    const response = await page.goto(path);
    expect(response!.status(), path).toBe(404);
  }
});

test("odd text is refused with 422 naming the field, and nothing is stored (row 7)", async ({ context, baseURL, page }) => {
  await signInAs(context, baseURL!, "engineer");
  const origin = new URL(baseURL!).origin;
  const nul = await page.request.post("/api/specs", { headers: { origin }, data: { maker: "Quillon\u0000Cells", model: "Q-1" } });
  expect(nul.status()).toBe(422);
  expect(await nul.json()).toMatchObject({ error: { code: "invalid", message: "The field “maker” contains a NUL character (U+0000), which cannot be stored. Nothing was saved.", fields: [{ path: "maker" }] } });
  const surrogate = await page.request.post("/api/specs", { headers: { origin, "content-type": "application/json" }, data: '{"maker":"Quillon \\ud800","model":"Q-2"}' });
  expect((await surrogate.json()).error.message).toMatch(/^The field “maker” contains a broken character/);
  let deep = '{"type":"text","text":"x"}';
  for (let i = 0; i < 1000; i++) deep = `{"type":"paragraph","content":[${deep}]}`;
  const nested = await page.request.post("/api/procedures/preview", { headers: { origin, "content-type": "application/json" }, data: `{"instructions":${deep}}` });
  expect(nested.status()).toBe(422);
  expect((await nested.json()).error.message).toMatch(/nested more than 128 levels deep/);
  const query = await page.request.get("/specs?q=%00");
  expect(query.status()).toBe(422);
  expect(await query.text()).toContain("The field “q” contains a NUL character");
  const apiQuery = await page.request.get("/api/specs?q=%00");
  expect(apiQuery.status()).toBe(422);
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    expect((await client.query("select count(*)::int as n from cell_specification where maker like 'Quillon%' and model in ('Q-1', 'Q-2')")).rows[0].n).toBe(0);
  } finally {
    await client.end();
  }
});

test("a too-large datasheet is refused with its size, before the proxy could cut it (row 12)", async ({ context, baseURL, page }) => {
  await signInAs(context, baseURL!, "engineer");
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  const specId = (await client.query("select id from cell_specification order by created_at limit 1")).rows[0].id as string;
  await client.end();
  const origin = new URL(baseURL!).origin;
  const big = await page.request.post(`/api/specs/${specId}/datasheet`, {
    headers: { origin },
    multipart: { datasheet: { name: "big.pdf", mimeType: "application/pdf", buffer: Buffer.alloc(13 * 1024 * 1024, 0x20) } },
  });
  expect(big.status()).toBe(413);
  expect((await big.json()).error.message).toMatch(/^The datasheet is 13\.0 MB; a datasheet may be at most 10 MB\./);
  const html = await page.request.post(`/api/specs/${specId}/datasheet`, {
    headers: { origin },
    multipart: { datasheet: { name: "page.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-1.4\n<html><script>alert(1)</script></html>\n%%EOF\n") } },
  });
  expect(html.status()).toBe(422);
  expect((await html.json()).error.message).toMatch(/is not a PDF that can be opened/);
});

test("a chunked body with no length is cut off at the limit on the public check route (row 2)", async ({ baseURL }) => {
  const url = new URL("/api/check/C-00001", baseURL!);
  // Unknown certificate numbers are refused before the body is read; either way the server stops early.
  const written = await new Promise<{ status: number; bytes: number }>((resolve, reject) => {
    let bytes = 0;
    const req = http(url, { method: "POST", headers: { "content-type": "application/pdf", "transfer-encoding": "chunked" } }, (res) => {
      res.resume();
      resolve({ status: res.statusCode ?? 0, bytes });
      req.destroy();
    });
    req.on("error", (e) => (bytes > 0 ? resolve({ status: 0, bytes }) : reject(e)));
    const chunk = Buffer.alloc(1024 * 1024);
    const pump = () => {
      while (bytes < 150 * 1024 * 1024) {
        bytes += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      req.end();
    };
    pump();
  });
  expect([404, 413]).toContain(written.status);
  expect(written.bytes).toBeLessThan(150 * 1024 * 1024);
});

test("a forged X-Forwarded-For is not the address the app records (row 4)", async ({ browser }) => {
  const forged = await browser.newContext({ extraHTTPHeaders: { "x-forwarded-for": "203.0.113.9" } });
  const page = await forged.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("nobody.forged@brackwater.example");
  await page.getByLabel("Password").fill("not a password at all");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Not signed in" })).toBeVisible();
  await forged.close();
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    const row = await client.query("select address from audit_event where actor_label = 'nobody.forged@brackwater.example' order by at desc limit 1");
    expect(row.rows[0].address).toBe("127.0.0.1");
  } finally {
    await client.end();
  }
});
