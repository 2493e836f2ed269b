import { type Kysely, sql } from "kysely";

// A data log is read by a worker process, not inside the upload request (docs/decisions/007). The upload
// stages the file in object storage and writes one job row with its audit event; the worker claims due
// rows with FOR UPDATE SKIP LOCKED and a lease, and writes the samples and the log in one transaction,
// so a worker that dies mid-way leaves nothing behind and the job is simply read again.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table log_ingest_job (
      id uuid primary key default gen_random_uuid(),
      run_id uuid not null references run(id),
      stored_file_id uuid not null references stored_file(id),
      mapping jsonb not null,
      remember_mapping boolean not null default false,
      requested_by text not null references app_user(id),
      state text not null default 'waiting'
        check (state in ('waiting', 'reading', 'stored', 'evaluated', 'refused', 'failed')),
      rows_read integer not null default 0 check (rows_read >= 0),
      attempts integer not null default 0 check (attempts >= 0),
      lease_until timestamptz,
      run_log_id uuid references run_log(id),
      outcome jsonb,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      finished_at timestamptz,
      constraint log_ingest_job_finished check ((state in ('stored', 'evaluated', 'refused', 'failed')) = (finished_at is not null)),
      constraint log_ingest_job_stored_log check (state not in ('stored', 'evaluated') or run_log_id is not null)
    )`.execute(db);
  await sql`create index log_ingest_job_due on log_ingest_job (created_at) where finished_at is null`.execute(db);
  await sql`create index log_ingest_job_by_run on log_ingest_job (run_id, created_at desc)`.execute(db);

  // A finished job is the record of what became of an upload: it no longer changes.
  await sql`
    create function log_ingest_job_final() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if old.finished_at is not null then
        raise exception 'this log upload has been dealt with; its outcome no longer changes' using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger log_ingest_job_final before update on log_ingest_job for each row execute function log_ingest_job_final()`.execute(db);

  // The app (web and worker) inserts and advances jobs; it never deletes one.
  await sql`revoke all on log_ingest_job from cellwright_app`.execute(db);
  await sql`grant select, insert, update on log_ingest_job to cellwright_app`.execute(db);

  // Samples are written while the log is still being read, before the log row that names them exists
  // (its sample count is known only at the end): the reference is checked when the transaction commits.
  await sql`alter table run_log_chunk alter constraint run_log_chunk_run_log_id_fkey deferrable initially deferred`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
