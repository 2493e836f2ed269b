import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import pg from "pg";
import { getPool } from "@/db/pool";
import { toErrorResponse } from "@/lib/api/error-response";
import { toActionState } from "@/lib/forms/action-state";
import { withAdminClient } from "../support/test-database";

// Issue 11 row 14: every database restart logged "uncaughtException: terminating connection…", and
// requests during the outage answered 500.
describe("the database goes away and comes back", () => {
  it("survives its idle connections being ended by the server, and reconnects", async () => {
    await getPool().query("select 1");
    const database = (await getPool().query<{ db: string }>("select current_database() as db")).rows[0]!.db;
    const warnings: string[] = [];
    const warn = console.warn;
    console.warn = (...args: unknown[]) => void warnings.push(args.join(" "));
    try {
      // What a restart does to the pool's idle connections (57P01 admin_shutdown).
      await withAdminClient(process.env.TEST_DATABASE_URL!, (c) =>
        c.query("select pg_terminate_backend(pid) from pg_stat_activity where datname = $1 and pid <> pg_backend_pid()", [database]),
      );
      await new Promise((resolve) => setTimeout(resolve, 300));
    } finally {
      console.warn = warn;
    }
    expect(warnings.join("\n")).toMatch(/database connection lost while idle \(57P01\)/);
    const rows = await getDb().selectFrom("app_user").select("id").execute();
    expect(Array.isArray(rows)).toBe(true);
  });

  it("answers 503 with a plain message while the database cannot be reached", async () => {
    // Nothing listens on port 1 of loopback: the state of a stopped database server.
    const stopped = new pg.Pool({ connectionString: process.env.DATABASE_URL!.replace(/:\d+\//, ":1/") });
    stopped.on("error", () => undefined);
    const refused = await stopped.query("select 1").catch((e: unknown) => e);
    await stopped.end();
    // A restart in the middle of a query: what pg reports to the caller.
    const cut = await (async () => {
      const client = await getPool().connect();
      const pid = (await client.query<{ pid: number }>("select pg_backend_pid() as pid")).rows[0]!.pid;
      client.on("error", () => undefined);
      const pending = client.query("select pg_sleep(5)").catch((e: unknown) => e);
      await withAdminClient(process.env.TEST_DATABASE_URL!, (c) => c.query("select pg_terminate_backend($1)", [pid]));
      const error = await pending;
      client.release(true);
      return error;
    })();
    for (const error of [refused, cut]) {
      const res = toErrorResponse(error, () => undefined);
      expect(res.status).toBe(503);
      const body = (await res.json()) as { error: { code: string; message: string } };
      expect(body.error).toEqual({ code: "unavailable", message: expect.stringMatching(/^The lab's database is not reachable just now/) });
      expect(toActionState(error, () => undefined).message).toMatch(/^The lab's database is not reachable just now/);
    }
  });
});
