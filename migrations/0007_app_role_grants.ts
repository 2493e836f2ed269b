import { type Kysely, sql } from "kysely";

// Least privilege (docs/deployment-database.md): migrations run as the owner role, which owns every
// table; the app signs in as cellwright_app and gets only the rows-level rights each table needs.
// Nothing here gives it TRUNCATE, REFERENCES, TRIGGER, ownership or any right on the migration tables,
// so it can neither disable a trigger nor empty a table. Tables made by later migrations get
// SELECT/INSERT/UPDATE/DELETE (and their sequences USAGE) by default; a migration that wants less
// revokes it for its own tables.
const APP_ROLE = "cellwright_app";

/** What the app does to each table, and nothing more. Append-only evidence is SELECT + INSERT. */
const TABLE_RIGHTS: Record<string, string> = {
  lab: "select, insert, update",
  app_user: "select, insert, update",
  user_session: "select, insert, update, delete",
  sign_in_attempt: "select, insert, delete",
  audit_event: "select, insert",
  stored_file: "select, insert",
  cell_specification: "select, insert, update",
  procedure: "select, insert",
  procedure_version: "select, insert, update",
  instrument: "select, insert, update",
  lot: "select, insert, update",
  specimen: "select, insert, update",
  run: "select, insert, update",
  run_instrument: "select, insert",
  step_record: "select, insert, update",
  run_log: "select, insert, update",
  run_log_chunk: "select, insert",
  run_evaluation: "select, insert",
  electronic_signature: "select, insert",
  run_review: "select, insert",
  certificate: "select, insert, update",
  mail_message: "select, insert, update",
  lot_sample_draw: "select, insert",
};

export async function up(db: Kysely<any>): Promise<void> {
  // The owner must not be a superuser (a superuser's tables ignore nothing, but its default privileges
  // would not follow the owner role in production), and the app role must exist before it is granted to.
  await sql`
    do $$ begin
      if (select rolsuper from pg_roles where rolname = current_user) then
        raise exception 'run the migrations as the owner role (cellwright_owner), not as the superuser %', current_user;
      end if;
      if not exists (select 1 from pg_roles where rolname = ${sql.lit(APP_ROLE)}) then
        raise exception 'the app role ${sql.raw(APP_ROLE)} does not exist: create it first (docs/deployment-database.md)';
      end if;
    end $$`.execute(db);

  const app = sql.id(APP_ROLE);
  await sql`revoke all on all tables in schema public from ${app}`.execute(db);
  await sql`revoke all on all sequences in schema public from ${app}`.execute(db);
  for (const [table, rights] of Object.entries(TABLE_RIGHTS)) {
    await sql`grant ${sql.raw(rights)} on ${sql.table(table)} to ${app}`.execute(db);
  }
  await sql`grant usage, select on all sequences in schema public to ${app}`.execute(db);
  await sql`grant usage on schema public to ${app}`.execute(db);

  await sql`alter default privileges in schema public grant select, insert, update, delete on tables to ${app}`.execute(db);
  await sql`alter default privileges in schema public grant usage, select on sequences to ${app}`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
