import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { expect, test } from "@playwright/test";
import pg from "pg";
import { can, ROLES, type Role } from "../../lib/auth/permissions";
import { ROUTE_ACCESS, type Access, type HttpMethod } from "../../lib/auth/route-access";
import { demoUser, openSession, SESSION_COOKIE } from "./fixtures";

type Found = { route: string; kind: "page" | "api"; methods: HttpMethod[] };

/** Every page and route handler under app/, as URL patterns (route groups dropped), with its methods. */
function discoverRoutes(dir = path.join(process.cwd(), "app"), segments: string[] = []): Found[] {
  const found: Found[] = [];
  for (const entry of readdirSync(dir)) {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) {
      if (entry.startsWith("_")) continue;
      const next = entry.startsWith("(") && entry.endsWith(")") ? segments : [...segments, entry];
      found.push(...discoverRoutes(full, next));
    } else if (entry === "page.tsx") {
      found.push({ route: `/${segments.join("/")}`, kind: "page", methods: ["GET"] });
    } else if (entry === "route.ts") {
      const source = readFileSync(full, "utf8");
      const methods = (["GET", "POST", "PUT", "PATCH", "DELETE"] as const).filter((m) =>
        new RegExp(`export (const|async function) ${m}\\b`).test(source),
      );
      found.push({ route: `/${segments.join("/")}`, kind: "api", methods: [...methods] });
    }
  }
  return found;
}

const routes = discoverRoutes();

function accessOf(route: string, method: HttpMethod): Access | undefined {
  const a = ROUTE_ACCESS[route];
  if (a === undefined || typeof a === "string" || Array.isArray(a)) return a as Access | undefined;
  return (a as Partial<Record<HttpMethod, Access>>)[method];
}

/** Real records from the seeded e2e database, so dynamic routes answer for real. */
async function sampleParams(): Promise<Record<string, string>> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    const proc = await c.query(`select p.id, v.number from procedure p join procedure_version v on v.procedure_id = p.id
      where v.status = 'released' order by p.code limit 1`);
    const spec = await c.query(`select id from cell_specification where datasheet_file_id is not null order by maker limit 1`);
    const instrument = await c.query(`select id from instrument order by identifier limit 1`);
    const lot = await c.query(`select id from lot order by identifier limit 1`);
    const specimen = await c.query(`select id from specimen order by identifier limit 1`);
    // The seeded demo run (scripts/seed-library.ts), planned with nothing recorded.
    const run = await c.query(`select id from run order by number limit 1`);
    const certificate = await c.query(`select number from certificate order by number limit 1`);
    return {
      procedure: proc.rows[0].id,
      n: String(proc.rows[0].number),
      spec: spec.rows[0].id,
      instrument: instrument.rows[0].id,
      lot: lot.rows[0].id,
      specimen: specimen.rows[0].id,
      run: run.rows[0].id,
      // The seeded certificate (scripts/demo-scenario.ts); a number never issued if there is none.
      certificate: certificate.rows[0]?.number ?? "C-99999",
      hasCertificate: String(certificate.rows.length > 0),
    };
  } finally {
    await c.end();
  }
}

function toUrl(route: string, p: Record<string, string>): string {
  return route
    .replace("/procedures/[id]", `/procedures/${p.procedure}`)
    .replace("/specs/[id]", `/specs/${p.spec}`)
    .replace("/runs/[id]", `/runs/${p.run}`)
    .replace("/instruments/[id]", `/instruments/${p.instrument}`)
    .replace("/lots/[id]", `/lots/${p.lot}`)
    .replace("/specimens/[id]", `/specimens/${p.specimen}`)
    .replace("[number]", p.certificate!)
    .replace("[n]", p.n!)
    .replace(/\[(\w+)\]/, (_, name: string) => {
      throw new Error(`no sample value for [${name}] in ${route}: add one in route-matrix.spec.ts`);
    });
}

test("every route on disk declares who may open it", () => {
  const undeclared = routes.flatMap((r) => r.methods.filter((m) => !accessOf(r.route, m)).map((m) => `${m} ${r.route}`));
  expect(undeclared, "add these to lib/auth/route-access.ts").toEqual([]);
  const stale = Object.keys(ROUTE_ACCESS).filter((r) => !routes.some((x) => x.route === r));
  expect(stale, "remove these from lib/auth/route-access.ts").toEqual([]);
});

/** What a role should get: 200 when allowed (a POST with an empty body then fails validation: 422). */
function expected(access: Access, kind: "page" | "api", method: HttpMethod, role: Role | null): number | "sign-in" {
  const allowedStatus = method === "GET" ? 200 : 422;
  if (access === "public") return allowedStatus;
  if (role === null) return kind === "api" ? 401 : "sign-in";
  if (access === "signed-in" || (typeof access === "string" ? can(role, access) : access.some((a) => can(role, a)))) return allowedStatus;
  return 403;
}

/** Routes that answer 404 for a run lacking what they show (the sample run may have no log yet). */
function expectedForSample(route: string, want: number | "sign-in", p: Record<string, string>): number | "sign-in" {
  if (route.includes("[number]") && p.hasCertificate !== "true" && (want === 200 || want === 422)) return 404;
  if (want !== 200) return want;
  if (["/api/runs/[id]/series", "/api/runs/[id]/logs/current"].includes(route) && p.runHasLog !== "true") return 404;
  if (["/api/runs/[id]/results.csv", "/api/runs/[id]/results.json"].includes(route) && p.runHasEvaluation !== "true") return 404;
  return want;
}

for (const role of [null, ...ROLES] as (Role | null)[]) {
  test(`route × role matrix: ${role ?? "signed out"}`, async ({ playwright, baseURL }) => {
    const params = await sampleParams();
    const headers: Record<string, string> = { origin: baseURL! };
    if (role) headers.cookie = `${SESSION_COOKIE}=${await openSession(demoUser(role).email)}`;
    const api = await playwright.request.newContext({ baseURL, extraHTTPHeaders: headers, maxRedirects: 0 });
    const failures: string[] = [];
    for (const { route, kind, methods } of routes) {
      for (const method of methods) {
        const url = toUrl(route, params);
        const res = method === "GET" ? await api.get(url) : await api.fetch(url, { method, data: {} });
        const got = res.status();
        if (route === "/sign-in" && role) {
          if (got !== 307) failures.push(`${route}: ${got} (wanted a redirect home)`);
          continue;
        }
        const want = expectedForSample(route, expected(accessOf(route, method)!, kind, method, role), params);
        const ok = want === "sign-in" ? got === 307 && (res.headers().location ?? "").includes("/sign-in") : got === want;
        if (!ok) failures.push(`${method} ${url}: got ${got}, wanted ${want}`);
      }
    }
    await api.dispose();
    expect(failures).toEqual([]);
  });
}

test("a POST from another origin is refused before it reaches the app", async ({ playwright, baseURL }) => {
  const api = await playwright.request.newContext({ baseURL });
  const cookie = `${SESSION_COOKIE}=${await openSession(demoUser("engineer").email)}`;
  const res = await api.post("/api/procedures", { headers: { origin: "http://evil.example", cookie }, data: {} });
  expect(res.status()).toBe(403);
  expect((await res.json()).error.code).toBe("foreign-origin");
  await api.dispose();
});

test("a forged session cookie gets 401 from the API and the sign-in page from the workbench", async ({ playwright, baseURL }) => {
  const api = await playwright.request.newContext({ baseURL, maxRedirects: 0, extraHTTPHeaders: { cookie: `${SESSION_COOKIE}=forged${"0".repeat(34)}` } });
  expect((await api.get("/api/me")).status()).toBe(401);
  const page = await api.get("/");
  expect(page.status()).toBe(307);
  expect(page.headers().location).toContain("/sign-in");
  await api.dispose();
});
