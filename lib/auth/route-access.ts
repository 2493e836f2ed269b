import type { Permission } from "./permissions";

export type Access = Permission | "public" | "signed-in";
export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

/**
 * Who may open each route, as the route itself checks it. The route × role matrix test walks app/
 * and fails for any route missing here, then checks every role gets the answer this table implies.
 * Pages have one access; route handlers one per exported method.
 * `public`: no sign-in; `signed-in`: any active user.
 */
export const ROUTE_ACCESS: Record<string, Access | Partial<Record<HttpMethod, Access>>> = {
  "/": "workbench.enter",
  "/sign-in": "public",
  "/audit": "audit.read",
  "/admin/users": "user.manage",
  "/procedures": "procedure.read",
  "/procedures/new": "procedure.author",
  "/procedures/[id]": "procedure.read",
  "/procedures/[id]/compare": "procedure.read",
  "/procedures/[id]/versions/[n]": "procedure.read",
  "/procedures/[id]/versions/[n]/edit": "procedure.author",
  "/specs": "spec.read",
  "/specs/new": "spec.manage",
  "/specs/[id]": "spec.read",
  "/specs/[id]/edit": "spec.manage",
  "/api/me": { GET: "signed-in" },
  "/api/health": { GET: "public" },
  "/api/procedures": { GET: "procedure.read", POST: "procedure.author" },
  "/api/procedures/preview": { POST: "procedure.author" },
  "/api/procedures/[id]/versions/[n]": { GET: "procedure.read" },
  "/api/procedures/[id]/versions/[n]/resolve": { POST: "procedure.read" },
  "/api/specs": { GET: "spec.read", POST: "spec.manage" },
  "/api/specs/[id]/datasheet": { GET: "spec.read", POST: "spec.manage" },
};
