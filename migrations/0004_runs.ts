import { type Kysely, sql } from "kysely";

// Runs of released procedure versions on specimens: the frozen set-points, what the operator recorded
// per step, the cycler's data logs (raw file in object storage, samples as chunked channel columns,
// docs/decisions/004) and each evaluation's findings.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`create sequence run_number_seq`.execute(db);
  await db.schema
    .createTable("run")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("number", "text", (c) => c.notNull().unique().defaultTo(sql`'R-' || lpad(nextval('run_number_seq')::text, 5, '0')`))
    .addColumn("procedure_version_id", "uuid", (c) => c.notNull().references("procedure_version.id"))
    .addColumn("specimen_id", "uuid", (c) => c.notNull().references("specimen.id"))
    .addColumn("operator_id", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("status", "text", (c) =>
      c.notNull().defaultTo("planned").check(sql`status in ('planned', 'in_progress', 'submitted', 'returned', 'accepted', 'certified')`),
    )
    // Set-points resolved when the run was started: later edits of the cell specification do not change them.
    .addColumn("resolution", "jsonb", (c) => c.notNull())
    .addColumn("cell_rating", "jsonb", (c) => c.notNull())
    .addColumn("procedure_source", "jsonb", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("started_at", "timestamptz")
    .addColumn("submitted_at", "timestamptz")
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("run_specimen_idx").on("run").column("specimen_id").execute();
  await db.schema.createIndex("run_status_idx").on("run").column("status").execute();

  // Only a released version can be started; the frozen resolution never changes afterwards.
  await sql`
    create function run_guard() returns trigger language plpgsql as $$
    declare version_status text;
    begin
      if tg_op = 'INSERT' then
        select status into version_status from procedure_version where id = new.procedure_version_id;
        if version_status is distinct from 'released' then
          raise exception 'a run can start only from a released procedure version' using errcode = 'P0001';
        end if;
      elsif (new.resolution, new.cell_rating, new.procedure_version_id, new.specimen_id)
            is distinct from (old.resolution, old.cell_rating, old.procedure_version_id, old.specimen_id) then
        raise exception 'the set-points, procedure version and specimen of run % are frozen', old.number using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_frozen before insert or update on run for each row execute function run_guard()`.execute(db);

  await db.schema
    .createTable("run_instrument")
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("instrument_id", "uuid", (c) => c.notNull().references("instrument.id"))
    .addPrimaryKeyConstraint("run_instrument_pkey", ["run_id", "instrument_id"])
    .execute();

  await db.schema
    .createTable("step_record")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("step_id", "text", (c) => c.notNull())
    .addColumn("cycle", "integer", (c) => c.notNull().defaultTo(1).check(sql`cycle >= 1`))
    // The record as lib/conformance's stepRecordSchema checks it (times, ambient, set-points, notes).
    .addColumn("record", "jsonb", (c) => c.notNull())
    .addColumn("completed", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("recorded_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("step_record_step_key", ["run_id", "step_id", "cycle"])
    .execute();

  await db.schema
    .createTable("run_log")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("stored_file_id", "uuid", (c) => c.notNull().references("stored_file.id"))
    .addColumn("mapping", "jsonb", (c) => c.notNull())
    .addColumn("sample_count", "integer", (c) => c.notNull().check(sql`sample_count > 0`))
    .addColumn("logged_from", "timestamptz")
    .addColumn("current", "boolean", (c) => c.notNull().defaultTo(true))
    .addColumn("uploaded_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("uploaded_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index run_log_one_current on run_log (run_id) where current`.execute(db);

  await db.schema
    .createTable("run_log_chunk")
    .addColumn("run_log_id", "uuid", (c) => c.notNull().references("run_log.id"))
    .addColumn("chunk", "integer", (c) => c.notNull())
    .addColumn("sample_count", "integer", (c) => c.notNull())
    .addColumn("time_s", "bytea", (c) => c.notNull())
    .addColumn("voltage_v", "bytea", (c) => c.notNull())
    .addColumn("current_a", "bytea", (c) => c.notNull())
    .addColumn("temperature_c", "bytea")
    .addPrimaryKeyConstraint("run_log_chunk_pkey", ["run_log_id", "chunk"])
    .execute();
  // Uncompressed, out of line: substring reads only the bytes it needs (docs/decisions/004).
  for (const column of ["time_s", "voltage_v", "current_a", "temperature_c"]) {
    await sql`alter table run_log_chunk alter column ${sql.ref(column)} set storage external`.execute(db);
  }

  await db.schema
    .createTable("run_evaluation")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("run_log_id", "uuid", (c) => c.references("run_log.id"))
    .addColumn("procedure_version_id", "uuid", (c) => c.notNull().references("procedure_version.id"))
    .addColumn("evaluation", "jsonb", (c) => c.notNull())
    .addColumn("procedure_followed", "text", (c) => c.notNull())
    .addColumn("specimen_conforms", "text", (c) => c.notNull())
    .addColumn("evaluated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("run_evaluation_run_idx").on("run_evaluation").columns(["run_id", "evaluated_at"]).execute();
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
