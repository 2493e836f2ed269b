import { expect, test } from "@playwright/test";
import pg from "pg";
import { ROLES, type Role } from "../../lib/auth/permissions";
import { admits } from "../../lib/auth/route-access";
import { signInAs } from "./fixtures";
import { accessOf, discoverRoutes, sampleParams, toUrl } from "./route-samples";

// Users see plain words: never a field path, an enum value, a UUID, a server path, JSON or a stack
// trace. Every page of the route matrix, opened by every role that may open it, is scanned for them.

const CODE_LIKE: { what: string; pattern: RegExp }[] = [
  { what: "a field path", pattern: /\b(?:definition\.)?steps\.\d+(?:\.\w+)*|\bdefinition\.\w+/ },
  { what: "a caution or error code", pattern: /\b[a-z]+(?:-[a-z]+)+\/[\w-]+\/[\w.]+/ },
  { what: "an enum value", pattern: /\b(?:in_progress|in_review|not_assessable|not_decided|procedure\.\w+|run\.\w+-?\w*|auth\.sign-\w+)\b/ },
  { what: "a value in snake_case", pattern: /\b[a-z]+_[a-z]+(?:_[a-z]+)*\b/ },
  { what: "a UUID", pattern: /\b[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\b/i },
  { what: "a server path", pattern: /(?:^|[\s"'(])\/(?:work|root|home|tmp|var|usr|etc|opt|srv)\/|\.data\// },
  { what: "JSON", pattern: /\{\s*"[\w-]+"\s*:/ },
  { what: "a stack trace", pattern: /\bat \w+ \(|\w+Error:/ },
];

/** Each finding as "what: …text around it…", so a failure says where to look. */
export function findCodeLike(text: string): string[] {
  const found: string[] = [];
  for (const { what, pattern } of CODE_LIKE) {
    const m = pattern.exec(text);
    if (m) found.push(`${what}: …${text.slice(Math.max(0, m.index - 40), m.index + m[0].length + 40).replace(/\s+/g, " ")}…`);
  }
  return found;
}

const pages = discoverRoutes().filter((r) => r.kind === "page");

function mayOpen(role: Role, route: string): boolean {
  const access = accessOf(route, "GET");
  if (!access) return false;
  return admits(access, role);
}

/**
 * Each page is scanned once, by the first role in this order that may open it (the words on a page are
 * the same for every role that reads it); home pages differ by role, so every role scans its own.
 */
const SCAN_ORDER: readonly Role[] = ["engineer", "admin", "auditor", "operator"];
function scannedBy(route: string): Role | null {
  if (route === "/") return null;
  return SCAN_ORDER.find((role) => mayOpen(role, route)) ?? null;
}

/** One run in each state in the e2e database (seeded, or made by earlier specs), comma-separated. */
async function listRunIds(): Promise<string> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    const rows = await c.query<{ id: string }>("select distinct on (status) id from run order by status, number");
    return rows.rows.map((r) => r.id).join(",");
  } finally {
    await c.end();
  }
}

for (const role of ROLES as readonly Role[]) {
  test(`no raw code on any page a ${role} may open`, async ({ browser, baseURL }) => {
    test.setTimeout(300_000);
    const params: Record<string, string> = { ...(await sampleParams()), allRuns: await listRunIds() };
    const context = await browser.newContext();
    await signInAs(context, baseURL!, role);
    const page = await context.newPage();
    const failures: string[] = [];
    for (const { route } of pages) {
      if (route === "/sign-in" || (route !== "/" && scannedBy(route) !== role)) continue;
      if (route.includes("[number]") && params.hasCertificate !== "true") continue;
      // Run pages differ most by the run's state: open them for every seeded run, not only the sample.
      const runs = route.startsWith("/runs/[id]") ? params.allRuns!.split(",") : [params.run!];
      for (const run of runs) {
        const url = toUrl(route, { ...params, run });
        const res = await page.goto(url);
        if (res?.status() !== 200) continue;
        // Client parts (step sheets, previews, tables) fetch their data after the first paint.
        await page.waitForLoadState("networkidle", { timeout: 5_000 }).catch(() => undefined);
        const text = await page.locator("body").innerText();
        for (const f of findCodeLike(text)) failures.push(`${url}: ${f}`);
      }
    }
    await context.close();
    expect(failures).toEqual([]);
  });
}

test("the code-like patterns catch what they are meant to catch, and leave lab words alone", () => {
  expect(findCodeLike("acknowledge before running steps.3.current")).toHaveLength(1);
  expect(findCodeLike("definition.steps.3.current.multipleOfIt")).not.toEqual([]);
  expect(findCodeLike("discharge-current-above-rating/discharge/current")).not.toEqual([]);
  expect(findCodeLike("in_progress → submitted")).not.toEqual([]);
  expect(findCodeLike("record 0b7f5a4e-2c1d-4e8f-9a6b-3c2d1e0f9a8b")).not.toEqual([]);
  expect(findCodeLike("key kept in /work/x/.data/signing/lab.p12")).not.toEqual([]);
  expect(findCodeLike('{"status":"released"}')).not.toEqual([]);
  expect(findCodeLike("Step 3 “Capacity discharge at 0.2 It”, current: 0.97 A at 23.4 °C; CC-CV charge; run R-00012 in progress")).toEqual([]);
});
