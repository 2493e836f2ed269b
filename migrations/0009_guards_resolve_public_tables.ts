import { type Kysely, sql } from "kysely";

// Trigger functions run with the caller's search_path, where the session's temporary schema comes first:
// a caller could create a temporary table named `run` (empty) and the guards would read it instead of the
// real one, finding nothing frozen. So every function of the schema resolves names in public first and in
// pg_temp last, and the app's role (through PUBLIC) may not create temporary tables here at all.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    do $$
    declare f record;
    begin
      for f in select p.oid::regprocedure as signature from pg_proc p
                where p.pronamespace = 'public'::regnamespace and p.proowner = current_user::regrole loop
        execute format('alter function %s set search_path = public, pg_temp', f.signature);
      end loop;
      execute format('revoke temporary on database %I from public', current_database());
    end $$`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
