import { sql } from "kysely";
import { getDb } from "@/db";
import { apiRoute } from "@/lib/auth/guards";

export const dynamic = "force-dynamic";

/** Public liveness check for the load balancer: says whether the database answers, nothing more. */
export const GET = apiRoute("/api/health", "GET", async () => {
  try {
    await sql`select 1`.execute(getDb());
    return Response.json({ status: "ok", database: "ok" });
  } catch (error) {
    console.error("health check: database unreachable", error);
    return Response.json({ status: "degraded", database: "unreachable" }, { status: 503 });
  }
});
