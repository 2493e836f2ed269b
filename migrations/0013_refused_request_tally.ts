import { type Kysely, sql } from "kysely";

// Refused cross-site requests are counted here per 10-minute window and origin; only the first refusal
// of each origin in a window becomes an audit event (issue 11 row 6: 50 forged POSTs in 2 s made 50
// permanent audit rows with text of the attacker's choosing).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("refused_request_tally")
    .addColumn("window_start", "timestamptz", (c) => c.notNull())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('foreign-origin')`))
    // Truncated by the app to 200 characters, control characters removed.
    .addColumn("origin", "text", (c) => c.notNull().check(sql`length(origin) <= 200`))
    .addColumn("last_path", "text", (c) => c.notNull().check(sql`length(last_path) <= 200`))
    .addColumn("count", "integer", (c) => c.notNull().defaultTo(1).check(sql`count >= 1`))
    .addColumn("last_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("refused_request_tally_pkey", ["window_start", "kind", "origin"])
    .execute();
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
