import { sql } from "kysely";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { isSameOrigin } from "./origin";

/** Refusals are counted per window; the first of each origin in a window is audited. */
export const REFUSAL_WINDOW_MINUTES = 10;
/** Past this many origins in one window, further ones are counted together (an attacker varying the header). */
export const ORIGINS_PER_WINDOW = 20;
export const OTHER_ORIGINS = "(further origins in this window)";

/** Header text is the caller's choice: at most 200 characters, no control characters. */
export function truncateHeaderText(value: string | null, max = 200): string {
  if (value === null) return "(none)";
  const clean = value.replace(/[\u0000-\u001f\u007f]/g, "?");
  return clean.length > max ? `${clean.slice(0, max - 1)}…` : clean;
}

/**
 * A refused cross-site write is a security event. Each one is counted (refused_request_tally); only the
 * first from an origin in each 10-minute window becomes an audit event, so a flood adds a count, not
 * rows. Best effort: a failure here never changes the refusal.
 */
export async function recordForeignOrigin(e: { method: string; path: string; origin: string | null; host: string | null }, now = new Date()) {
  try {
    const windowMs = REFUSAL_WINDOW_MINUTES * 60_000;
    const windowStart = new Date(Math.floor(now.getTime() / windowMs) * windowMs);
    const path = truncateHeaderText(e.path);
    await getDb().transaction().execute(async (tx) => {
      // One writer per window at a time, so the count of origins below is exact.
      await sql`select pg_advisory_xact_lock(hashtext('refused-origin'), ${Math.floor(windowStart.getTime() / windowMs) % 2147483647})`.execute(tx);
      let origin = truncateHeaderText(e.origin);
      const known = await tx.selectFrom("refused_request_tally").select("origin").where("window_start", "=", windowStart).where("kind", "=", "foreign-origin").execute();
      if (!known.some((k) => k.origin === origin) && known.length >= ORIGINS_PER_WINDOW) origin = OTHER_ORIGINS;
      const row = await tx
        .insertInto("refused_request_tally")
        .values({ window_start: windowStart, kind: "foreign-origin", origin, last_path: path, last_at: now })
        .onConflict((oc) => oc.columns(["window_start", "kind", "origin"]).doUpdateSet({ count: sql`refused_request_tally.count + 1`, last_path: path, last_at: now }))
        .returning("count")
        .executeTakeFirstOrThrow();
      if (row.count !== 1) return;
      await recordAuditEvent(tx, {
        actorId: null,
        actorLabel: "unknown caller",
        action: "security.foreign-origin-refused",
        detail: {
          method: truncateHeaderText(e.method, 10),
          path,
          origin,
          host: truncateHeaderText(e.host),
          note: `Further refusals from this origin until ${new Date(windowStart.getTime() + windowMs).toISOString()} are counted, not written one by one (Administration → Sign-in security).`,
        },
      });
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
