import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { isSameOrigin } from "./origin";

/** A refused cross-site write is a security event: it goes to the audit trail, best effort. */
export async function recordForeignOrigin(e: { method: string; path: string; origin: string | null; host: string | null }) {
  try {
    await recordAuditEvent(getDb(), {
      actorId: null,
      actorLabel: "unknown caller",
      action: "security.foreign-origin-refused",
      detail: e,
    });
  } catch (error) {
    console.error("could not record a refused foreign-origin request", error);
  }
}

/**
 * The proxy's origin check, for the upload routes the proxy leaves out (it would buffer their bodies):
 * a refusal answer before a byte of the body is read, or null when the request is same-origin.
 */
export async function refuseForeignUpload(req: Request): Promise<Response | null> {
  const origin = req.headers.get("origin");
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host");
  if (isSameOrigin(origin, host)) return null;
  await recordForeignOrigin({ method: req.method, path: new URL(req.url).pathname, origin, host });
  return Response.json({ error: { code: "foreign-origin", message: "This request came from another site and was refused." } }, { status: 403 });
}
