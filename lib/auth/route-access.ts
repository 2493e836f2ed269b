import type { Permission } from "./permissions";

/** A list admits a caller holding any one of its permissions. */
export type Access = Permission | readonly Permission[] | "public" | "signed-in";
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
  "/admin/mail": "mail.read",
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
  "/api/procedures/preview": { POST: "procedure.author" },
  "/api/procedures/[id]/versions/[n]": { GET: "procedure.read" },
  "/api/procedures/[id]/versions/[n]/resolve": { POST: "procedure.read" },
  "/api/specs": { GET: "spec.read", POST: "spec.manage" },
  "/api/specs/[id]/datasheet": { GET: "spec.read", POST: "spec.manage" },
  "/api/instruments": { GET: "run.read" },
  "/api/lots": { GET: "run.read", POST: "specimen.manage" },
  "/api/specimens": { GET: "run.read", POST: "specimen.manage" },
  "/runs/[id]/log": "run.read",
  "/runs/[id]/results": "run.read",
  "/runs/[id]/review": "run.read",
  "/runs/[id]/history": "run.read",
  "/api/runs": { GET: "run.read" },
  "/api/runs/[id]": { GET: "run.read" },
  "/api/runs/[id]/series": { GET: "run.read" },
  "/api/runs/[id]/logs": { POST: "run.operate" },
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
};
