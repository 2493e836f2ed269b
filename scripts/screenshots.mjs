import { chromium } from "@playwright/test";
import pg from "pg";
import { randomBytes } from "node:crypto";
const base = process.env.BASE ?? "http://localhost:3100";
const db = process.env.E2E_DATABASE_URL;
const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--disable-background-networking", "--no-first-run", "--disable-quic"] });
async function session(email) {
  const c = new pg.Client({ connectionString: db }); await c.connect();
  const id = randomBytes(20).toString("hex");
  await c.query("insert into user_session (id,user_id,expires_at) select $1,id,now()+interval '1 hour' from app_user where email=$2", [id, email]);
  await c.end(); return id;
}
const shots = JSON.parse(process.argv[2]);
for (const [name, email, path, width] of shots) {
  const ctx = await browser.newContext({ viewport: { width: width ?? 1280, height: 900 } });
  if (email) await ctx.addCookies([{ name: "cellwright_session", value: await session(email), url: base }]);
  const p = await ctx.newPage(); await p.goto(base + path); await p.waitForLoadState("networkidle");
  await p.screenshot({ path: `/tmp/shot-${name}.png`, fullPage: true }); await ctx.close();
}
await browser.close();
