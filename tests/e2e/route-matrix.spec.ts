import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import { expect, test } from "@playwright/test";
import { can, ROLES, type Role } from "../../lib/auth/permissions";
import { ROUTE_ACCESS } from "../../lib/auth/route-access";
import { openSession, demoUser, SESSION_COOKIE } from "./fixtures";

/** Every page and route handler under app/, as URL patterns: route groups dropped. */
function discoverRoutes(dir = path.join(process.cwd(), "app"), segments: string[] = []): { route: string; kind: "page" | "api" }[] {
  const found: { route: string; kind: "page" | "api" }[] = [];
  for (const entry of readdirSync(dir)) {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) {
      if (entry.startsWith("_")) continue;
      const next = entry.startsWith("(") && entry.endsWith(")") ? segments : [...segments, entry];
      found.push(...discoverRoutes(full, next));
    } else if (entry === "page.tsx" || entry === "route.ts") {
      found.push({ route: `/${segments.join("/")}`, kind: entry === "route.ts" ? "api" : "page" });
    }
  }
  return found;
}

// Sample values for dynamic segments; a dynamic route without one fails the first test.
const SAMPLE_PARAMS: Record<string, string> = {};

function toUrl(route: string): string {
  return route.replace(/\[([^\]]+)\]/g, (_, name: string) => {
    const v = SAMPLE_PARAMS[name];
    if (!v) throw new Error(`no sample value for [${name}] in ${route}`);
    return v;
  });
}

const routes = discoverRoutes();

test("every route on disk declares who may open it", () => {
  const undeclared = routes.map((r) => r.route).filter((r) => !(r in ROUTE_ACCESS));
  expect(undeclared, "add these to lib/auth/route-access.ts").toEqual([]);
  const stale = Object.keys(ROUTE_ACCESS).filter((r) => !routes.some((x) => x.route === r));
  expect(stale, "remove these from lib/auth/route-access.ts").toEqual([]);
});

function expectedStatus(route: string, kind: "page" | "api", role: Role | null): number | "redirect-to-sign-in" {
  const access = ROUTE_ACCESS[route]!;
  if (access === "public") return 200;
  if (role === null) return kind === "api" ? 401 : "redirect-to-sign-in";
  if (access === "signed-in" || can(role, access)) return 200;
  return 403;
}

for (const role of [null, ...ROLES] as (Role | null)[]) {
  test(`route × role matrix: ${role ?? "signed out"}`, async ({ playwright, baseURL }) => {
    const headers: Record<string, string> = {};
    if (role) headers.cookie = `${SESSION_COOKIE}=${await openSession(demoUser(role).email)}`;
    const api = await playwright.request.newContext({ baseURL, extraHTTPHeaders: headers, maxRedirects: 0 });
    const failures: string[] = [];
    for (const { route, kind } of routes) {
      const want = expectedStatus(route, kind, role);
      const res = await api.get(toUrl(route));
      // The sign-in page sends a signed-in person home.
      if (route === "/sign-in" && role) {
        if (res.status() !== 307) failures.push(`${route}: ${res.status()} (wanted a redirect home)`);
        continue;
      }
      const got = res.status();
      const ok =
        want === "redirect-to-sign-in"
          ? got === 307 && (res.headers().location ?? "").includes("/sign-in")
          : got === want;
      if (!ok) failures.push(`${route}: got ${got}, wanted ${want}`);
    }
    await api.dispose();
    expect(failures).toEqual([]);
  });
}

test("a POST from another origin is refused before it reaches the app", async ({ playwright, baseURL }) => {
  const api = await playwright.request.newContext({ baseURL });
  const cookie = `${SESSION_COOKIE}=${await openSession(demoUser("admin").email)}`;
  const res = await api.post("/api/me", { headers: { origin: "http://evil.example", cookie } });
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
