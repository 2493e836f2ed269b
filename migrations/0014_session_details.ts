import { type Kysely, sql } from "kysely";

// What a person needs to recognise their own sessions (issue 11: a sessions list with "sign out
// everywhere"): when and from where each was opened, and which browser. Sessions made before this
// migration show "not recorded".
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("user_session")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("address", "text", (c) => c.check(sql`length(address) <= 100`))
    .addColumn("client", "text", (c) => c.check(sql`length(client) <= 200`))
    .execute();
  await db.schema.createIndex("user_session_user_idx").on("user_session").column("user_id").execute();
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
