import { type Kysely, sql } from "kysely";

// Once a run is accepted (and later certified), everything its certificate rests on is frozen by the
// database itself, whoever asks: the run's row and status, its step records (with their ambient
// readings), instruments, data logs and their sample chunks, the stored-file rows of those logs, and its
// evaluations. Amending or revoking acts on certificates only (0005), never on a run's evidence. Open
// runs (planned, in progress, returned) stay writable; a submitted run is guarded by the app until review.

/** Tables whose rows name their run in run_id: frozen with the run. */
const RUN_EVIDENCE_TABLES = ["step_record", "run_instrument", "run_log", "run_evaluation"] as const;

/** Evidence tables never emptied wholesale, by anyone: TRUNCATE skips row triggers, so it is refused here. */
const NEVER_TRUNCATED = [
  "run",
  "step_record",
  "run_instrument",
  "run_log",
  "run_log_chunk",
  "run_evaluation",
  "stored_file",
  "electronic_signature",
  "run_review",
  "certificate",
  "procedure_version",
  "lot_sample_draw",
] as const;

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function run_is_frozen(p_run_id uuid) returns boolean language sql stable as $$
      select exists (select 1 from run where id = p_run_id and status in ('accepted', 'certified'))
    $$`.execute(db);

  // One guard for every table keyed by run: the trigger's argument names the run column, so a table a
  // later migration adds (e.g. corrected readings) is frozen with one CREATE TRIGGER.
  await sql`
    create function run_evidence_guard() returns trigger language plpgsql as $$
    declare
      run_ids uuid[] := '{}';
      frozen_number text;
    begin
      if tg_op in ('UPDATE', 'DELETE') then run_ids := run_ids || (to_jsonb(old) ->> tg_argv[0])::uuid; end if;
      if tg_op in ('UPDATE', 'INSERT') then run_ids := run_ids || (to_jsonb(new) ->> tg_argv[0])::uuid; end if;
      select number into frozen_number from run where id = any(run_ids) and status in ('accepted', 'certified') limit 1;
      if frozen_number is not null then
        raise exception 'run % has been accepted: its records, logs and evaluations are frozen (% refused on %)', frozen_number, tg_op, tg_table_name
          using errcode = 'P0001';
      end if;
      if tg_op = 'DELETE' then return old; end if;
      return new;
    end $$`.execute(db);
  for (const table of RUN_EVIDENCE_TABLES) {
    await sql`create trigger ${sql.id(`${table}_frozen_with_run`)} before insert or update or delete on ${sql.table(table)}
      for each row execute function run_evidence_guard('run_id')`.execute(db);
  }

  // Sample chunks name their log, not their run.
  await sql`
    create function run_log_chunk_guard() returns trigger language plpgsql as $$
    declare
      log_ids uuid[] := '{}';
      frozen_number text;
    begin
      if tg_op in ('UPDATE', 'DELETE') then log_ids := log_ids || old.run_log_id; end if;
      if tg_op in ('UPDATE', 'INSERT') then log_ids := log_ids || new.run_log_id; end if;
      select r.number into frozen_number from run_log l join run r on r.id = l.run_id
       where l.id = any(log_ids) and r.status in ('accepted', 'certified') limit 1;
      if frozen_number is not null then
        raise exception 'run % has been accepted: its logged samples are frozen (% refused)', frozen_number, tg_op using errcode = 'P0001';
      end if;
      if tg_op = 'DELETE' then return old; end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_log_chunk_frozen_with_run before insert or update or delete on run_log_chunk
    for each row execute function run_log_chunk_guard()`.execute(db);

  // A stored file's record (where its bytes are, their size and SHA-256, who sent them) never changes:
  // a new version is a new file. One that a frozen run's log or a certificate uses is never removed.
  await sql`
    create function stored_file_guard() returns trigger language plpgsql as $$
    begin
      if tg_op = 'UPDATE' then
        if (new.id, new.storage_key, new.original_name, new.content_type, new.size_bytes, new.sha256, new.purpose, new.uploaded_by, new.uploaded_at)
           is distinct from
           (old.id, old.storage_key, old.original_name, old.content_type, old.size_bytes, old.sha256, old.purpose, old.uploaded_by, old.uploaded_at) then
          raise exception 'the record of stored file % never changes', old.original_name using errcode = 'P0001';
        end if;
        return new;
      end if;
      if exists (select 1 from run_log l where l.stored_file_id = old.id and run_is_frozen(l.run_id))
         or exists (select 1 from certificate c where c.pdf_file_id = old.id) then
        raise exception 'stored file % is evidence of an accepted run or a certificate and cannot be removed', old.original_name using errcode = 'P0001';
      end if;
      return old;
    end $$`.execute(db);
  await sql`create trigger stored_file_frozen before update or delete on stored_file
    for each row execute function stored_file_guard()`.execute(db);

  // The run itself: only the forward steps of the review may reach 'accepted' and 'certified', each with
  // its record in place; after acceptance nothing changes but accepted → certified.
  await sql`
    create function run_status_guard() returns trigger language plpgsql as $$
    begin
      if tg_op = 'INSERT' then
        -- A run is never created already past review.
        if new.status in ('accepted', 'certified') then
          raise exception 'a run starts open: it is accepted only from review' using errcode = 'P0001';
        end if;
        return new;
      elsif tg_op = 'DELETE' then
        if old.status in ('accepted', 'certified') then
          raise exception 'run % is accepted and cannot be deleted', old.number using errcode = 'P0001';
        end if;
        return old;
      end if;
      if old.status in ('accepted', 'certified') then
        if (to_jsonb(new) - 'status' - 'updated_at') is distinct from (to_jsonb(old) - 'status' - 'updated_at')
           or not (new.status = old.status or (old.status = 'accepted' and new.status = 'certified')) then
          raise exception 'run % is %: its record and status are frozen', old.number, old.status using errcode = 'P0001';
        end if;
      end if;
      if new.status = 'accepted' and old.status <> 'accepted' then
        if old.status <> 'submitted'
           or not exists (select 1 from run_review where run_id = new.id and decision = 'accepted' and signature_id is not null) then
          raise exception 'run % can be accepted only from review, with a signed acceptance', old.number using errcode = 'P0001';
        end if;
      end if;
      if new.status = 'certified' and old.status <> 'certified' then
        if old.status <> 'accepted' or not exists (select 1 from certificate where run_id = new.id) then
          raise exception 'run % can be certified only once accepted, with its certificate issued', old.number using errcode = 'P0001';
        end if;
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_status_flow before insert or update or delete on run
    for each row execute function run_status_guard()`.execute(db);

  await sql`
    create function refuse_truncate() returns trigger language plpgsql as $$
    begin
      raise exception '% is evidence: it is never emptied (TRUNCATE refused)', tg_table_name using errcode = 'P0001';
    end $$`.execute(db);
  for (const table of NEVER_TRUNCATED) {
    await sql`create trigger ${sql.id(`${table}_no_truncate`)} before truncate on ${sql.table(table)}
      for each statement execute function refuse_truncate()`.execute(db);
  }
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
