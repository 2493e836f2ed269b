import { type Kysely, sql } from "kysely";

// A run's log may arrive in parts over days (a cycler pushing what it has written so far). Each accepted
// part keeps its own stored file, SHA-256, time span, sample count and place in the order; its samples are
// appended to the run's current log as further chunks, so evaluation reads one ordered stream. A part is
// read by the log worker like a whole upload (a job); until it is accepted only its staged object exists,
// so a refused part leaves no stored-file row behind.
export async function up(db: Kysely<any>): Promise<void> {
  // A log whose first part was pushed by a machine has no user behind it.
  await sql`alter table run_log alter column uploaded_by drop not null`.execute(db);
  await sql`alter table stored_file alter column uploaded_by drop not null`.execute(db);
  await sql`alter table run_log add column in_parts boolean not null default false`.execute(db);

  await sql`
    create table run_log_part (
      id uuid primary key,
      run_id uuid not null references run(id),
      run_log_id uuid not null references run_log(id) deferrable initially deferred,
      part_number integer not null check (part_number >= 1),
      stored_file_id uuid not null unique references stored_file(id),
      sha256 text not null check (sha256 ~ '^[0-9a-f]{64}$'),
      header jsonb not null,
      first_chunk integer not null check (first_chunk >= 0),
      chunk_count integer not null check (chunk_count >= 1),
      sample_count integer not null check (sample_count > 0),
      first_time_s double precision not null,
      last_time_s double precision not null,
      starts_at timestamptz,
      ends_at timestamptz,
      gap_before_s double precision check (gap_before_s > 0),
      uploaded_by text references app_user(id),
      machine_token_id uuid,
      machine_label text,
      received_at timestamptz not null default now(),
      constraint run_log_part_number unique (run_id, part_number),
      constraint run_log_part_once unique (run_id, sha256),
      constraint run_log_part_span check (last_time_s >= first_time_s),
      constraint run_log_part_sender check ((uploaded_by is null) <> (machine_token_id is null) and (machine_token_id is null) = (machine_label is null))
    )`.execute(db);

  // An accepted part is kept exactly as it was received.
  await sql`
    create function run_log_part_kept() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      raise exception 'an accepted log part is kept as it was received; it cannot be changed or removed' using errcode = 'P0001';
    end $$`.execute(db);
  await sql`create trigger run_log_part_kept before update or delete on run_log_part for each row execute function run_log_part_kept()`.execute(db);
  await sql`create trigger run_log_part_frozen_with_run before insert or update or delete on run_log_part for each row execute function run_evidence_guard('run_id')`.execute(db);
  // Whoever uploads a part takes part in the run (0012); a part pushed by a machine has no person behind it.
  await sql`
    create or replace function run_participant_from_record() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if tg_table_name = 'run' then
        perform note_run_participant(new.id, new.operator_id, 'started');
      elsif tg_table_name = 'step_record' then
        perform note_run_participant(new.run_id, new.recorded_by, 'recorded');
      elsif tg_table_name in ('run_log', 'run_log_part') then
        if new.uploaded_by is not null then perform note_run_participant(new.run_id, new.uploaded_by, 'uploaded'); end if;
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_participant_part_uploaded after insert on run_log_part for each row execute function run_participant_from_record()`.execute(db);
  await sql`revoke all on run_log_part from cellwright_app`.execute(db);
  await sql`grant select, insert on run_log_part to cellwright_app`.execute(db);

  // A part's job stages only an object (key, hash, size); the stored-file row is written when the part is accepted.
  await sql`alter table log_ingest_job alter column stored_file_id drop not null`.execute(db);
  await sql`alter table log_ingest_job alter column requested_by drop not null`.execute(db);
  await sql`
    alter table log_ingest_job
      add column part_id uuid unique,
      add column file_name text,
      add column staged_key text,
      add column staged_sha256 text,
      add column staged_size bigint,
      add column mapping_given boolean not null default true,
      add column machine_token_id uuid,
      add column machine_label text,
      add constraint log_ingest_job_file check (stored_file_id is not null or (part_id is not null and staged_key is not null and staged_sha256 is not null and staged_size is not null and file_name is not null)),
      add constraint log_ingest_job_sender check ((requested_by is null) <> (machine_token_id is null) and (machine_token_id is null) = (machine_label is null))`.execute(db);
  await sql`create index log_ingest_job_part_sha on log_ingest_job (run_id, staged_sha256) where part_id is not null`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
