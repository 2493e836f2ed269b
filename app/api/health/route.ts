import { sql } from "kysely";
import { getDb } from "@/db";

export const dynamic = "force-dynamic";

/** Public liveness check for the load balancer: says whether the database answers, nothing more. */
export async function GET(): Promise<Response> {
  try {
    await sql`select 1`.execute(getDb());
    return Response.json({ status: "ok", database: "ok" });
  } catch (error) {
    console.error("health check: database unreachable", error);
    return Response.json({ status: "degraded", database: "unreachable" }, { status: 503 });
  }
}
