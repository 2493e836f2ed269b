import { can, type Permission, type Role } from "./permissions";

/**
 * A list admits a caller holding any one of its permissions. `machine-token`: only a cycler PC with a
 * token an administrator issued (lib/machine-tokens); no session, whatever its role, is admitted.
 */
export type Access = Permission | readonly Permission[] | "public" | "signed-in" | "machine-token";
export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

/**
 * Who may open each route: the one place access is written. Pages read it through
 * `requirePageAccess("/pattern")`, layouts through `requireAreaAccess`, route handlers through
 * `apiRoute("/api/pattern", "GET", …)`, server actions through `serverAction({ access: "/pattern" })`.
 * tests/unit/route-access.test.ts checks every page and handler names its own pattern; the route × role
 * matrix checks every role gets the answer this table implies.
 * Pages have one access; route handlers one per exported method.
 * `public`: no sign-in; `signed-in`: any active user; `machine-token`: a cycler PC's token, never a session.
 */
export const ROUTE_ACCESS = {
  "/": "workbench.enter",
  "/sign-in": "public",
  "/audit": "audit.read",
  "/admin/users": "user.manage",
  "/admin/mail": "mail.read",
  "/admin/signing-key": "signing-key.manage",
  "/admin/integrity": "lab.manage",
  "/procedures": "procedure.read",
  "/procedures/new": "procedure.author",
  "/procedures/[id]": "procedure.read",
  "/procedures/[id]/compare": "procedure.read",
  "/procedures/[id]/versions/[n]": "procedure.read",
  "/procedures/[id]/versions/[n]/edit": "procedure.author",
  "/procedures/[id]/versions/[n]/release": "procedure.release",
  "/specs": "spec.read",
  "/specs/new": "spec.manage",
  "/specs/[id]": "spec.read",
  "/specs/[id]/edit": "spec.manage",
  "/instruments": "run.read",
  "/instruments/new": "instrument.manage",
  "/instruments/[id]/edit": "instrument.manage",
  "/lots": "run.read",
  "/lots/new": "specimen.manage",
  "/lots/[id]": "run.read",
  "/lots/[id]/edit": "specimen.manage",
  "/specimens": "run.read",
  "/specimens/new": "specimen.manage",
  "/specimens/[id]": "run.read",
  "/specimens/[id]/edit": "specimen.manage",
  "/runs": "run.read",
  "/runs/new": "run.operate",
  "/runs/[id]": "run.read",
  "/api/me": { GET: "signed-in" },
  "/api/health": { GET: "public" },
  "/api/procedures": { GET: "procedure.read", POST: "procedure.author" },
  "/api/audit/trail.csv": { GET: "audit.read" },
  "/api/procedures/preview": { POST: "procedure.author" },
  "/api/procedures/[id]/versions/[n]": { GET: "procedure.read" },
  "/api/procedures/[id]/versions/[n]/resolve": { POST: "procedure.read" },
  "/api/specs": { GET: "spec.read", POST: "spec.manage" },
  "/api/specs/[id]/datasheet": { GET: "spec.read", POST: "spec.manage" },
  "/api/instruments": { GET: "run.read" },
  "/api/lots": { GET: "run.read", POST: "specimen.manage" },
  "/api/sampling-plan": { POST: "signed-in" },
  "/api/specimens": { GET: "run.read", POST: "specimen.manage" },
  "/runs/[id]/log": "run.read",
  "/runs/[id]/results": "run.read",
  "/runs/[id]/review": "run.read",
  "/runs/[id]/history": "run.read",
  "/api/runs": { GET: "run.read" },
  "/api/runs/[id]": { GET: "run.read" },
  "/api/runs/[id]/series": { GET: "run.read" },
  "/api/runs/[id]/cycles": { GET: "run.read" },
  "/api/runs/[id]/logs": { GET: "run.read", POST: "run.operate" },
  "/api/runs/[id]/log-parts": { POST: "run.operate" },
  "/api/channel/log-parts": { POST: "machine-token" },
  "/api/runs/[id]/logs/current": { GET: "run.read" },
  "/api/runs/[id]/evaluations": { POST: ["run.operate", "run.review"] },
  "/api/runs/[id]/results.csv": { GET: "run.read" },
  "/api/runs/[id]/results.json": { GET: "run.read" },
  "/certificates": "certificate.read",
  "/certificates/[number]": "certificate.read",
  "/check/[number]": "public",
  "/api/certificates": { GET: "certificate.read" },
  "/api/certificates/[number]": { GET: "certificate.read" },
  "/api/certificates/[number]/pdf": { GET: "certificate.read" },
  "/api/certificates/[number]/evidence": { GET: "certificate.read" },
  "/api/check/[number]": { GET: "public", POST: "public" },
  "/lots/[id]/statistics": "run.read",
  "/specs/[id]/measured": "run.read",
  "/specimens/[id]/rate-capability": "run.read",
  "/compare": "run.read",
  "/api/lots/[id]/summary": { GET: "run.read" },
  "/api/lots/[id]/results.csv": { GET: "run.read" },
  "/api/lots/[id]/results.json": { GET: "run.read" },
  "/api/specs/[id]/summary": { GET: "run.read" },
  "/api/compare/series": { GET: "run.read" },
  "/api/compare/results.csv": { GET: "run.read" },
  "/account": "workbench.enter",
  "/admin/security": "user.manage",
  "/admin/cycler-tokens": "cycler-token.manage",
} as const satisfies Record<string, Access | Partial<Record<HttpMethod, Access>>>;

type Table = typeof ROUTE_ACCESS;
export type RoutePattern = keyof Table;
/** Routes with one access: pages. */
export type PagePattern = { [R in RoutePattern]: Table[R] extends Access ? R : never }[RoutePattern];
/** Routes with an access per method: route handlers. */
export type ApiPattern = Exclude<RoutePattern, PagePattern>;
export type MethodOf<R extends ApiPattern> = keyof Table[R] & HttpMethod;
export type AccessOf<R extends RoutePattern, M extends HttpMethod = "GET"> = R extends PagePattern
  ? Table[R]
  : R extends ApiPattern
    ? M extends keyof Table[R]
      ? Table[R][M]
      : never
    : never;

/** The access the table declares for a route (and, for a route handler, one method); undefined if none. */
export function routeAccess(route: string, method: HttpMethod = "GET"): Access | undefined {
  const entry = (ROUTE_ACCESS as Record<string, Access | Partial<Record<HttpMethod, Access>>>)[route];
  if (entry === undefined || typeof entry === "string" || Array.isArray(entry)) return entry as Access | undefined;
  return (entry as Partial<Record<HttpMethod, Access>>)[method];
}

/** Whether a caller (null: signed out) is admitted by an access. */
export function admits(access: Access, role: Role | null): boolean {
  if (access === "public") return true;
  if (role === null || access === "machine-token") return false;
  if (access === "signed-in") return true;
  if (typeof access === "string") return can(role, access as Permission);
  return access.some((p) => can(role, p));
}

/**
 * An area (a layout's folder) admits whoever may open at least one signed-in page at or under it:
 * each page then checks its own access. Public pages do not open an area.
 */
export function areaAccess(area: string): Access | undefined {
  const within = (Object.entries(ROUTE_ACCESS) as [string, Access | object][]).filter(
    ([route, access]) => (route === area || route.startsWith(area === "/" ? "/" : `${area}/`)) && isPageAccess(access) && access !== "public" && access !== "machine-token",
  );
  if (within.length === 0) return undefined;
  const accesses = within.map(([, a]) => a as Access);
  if (accesses.includes("signed-in")) return "signed-in";
  const permissions = [...new Set(accesses.flatMap((a) => (typeof a === "string" ? [a as Permission] : [...(a as readonly Permission[])])))];
  return permissions.length === 1 ? permissions[0]! : permissions;
}

function isPageAccess(value: unknown): value is Access {
  return typeof value === "string" || Array.isArray(value);
}
