import { expect, test } from "@playwright/test";
import { ROLES, type Role } from "../../lib/auth/permissions";
import { admits, ROUTE_ACCESS, type Access, type HttpMethod } from "../../lib/auth/route-access";
import { demoUser, openSession, SESSION_COOKIE } from "./fixtures";
import { accessOf, discoverRoutes, sampleParams, toUrl } from "./route-samples";

const routes = discoverRoutes();

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
  // A token route never reads a session: a signed-in role is as unknown to it as nobody.
  if (access === "machine-token") return 401;
  if (role === null) return kind === "api" ? 401 : "sign-in";
  if (access === "signed-in" || admits(access, role)) return allowedStatus;
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
