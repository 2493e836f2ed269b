import { type Kysely, sql } from "kysely";

// A run can be abandoned (cell vented, equipment fault, wrong specimen) with a reason: it is kept with
// all its records, shown as abandoned and left out of every statistic. An abandoned run stays so.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table run drop constraint run_status_check`.execute(db);
  await sql`
    alter table run add constraint run_status_check
      check (status in ('planned', 'in_progress', 'submitted', 'returned', 'accepted', 'certified', 'abandoned'))`.execute(db);
  await sql`
    alter table run
      add column abandoned_at timestamptz,
      add column abandoned_by text references app_user(id),
      add column abandon_reason text,
      add constraint run_abandon_reason check (
        (status = 'abandoned') = (abandoned_at is not null and abandoned_by is not null and coalesce(length(trim(abandon_reason)), 0) > 0)
      )`.execute(db);

  await sql`
    create function run_abandoned_final() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if old.status = 'abandoned' and (new.status, new.abandoned_at, new.abandoned_by, new.abandon_reason)
          is distinct from (old.status, old.abandoned_at, old.abandoned_by, old.abandon_reason) then
        raise exception 'run % is abandoned; it stays so', old.number using errcode = 'P0001';
      end if;
      if new.status = 'abandoned' and old.status not in ('planned', 'in_progress', 'returned', 'abandoned') then
        raise exception 'run % is %; only an open run can be abandoned', old.number, old.status using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_abandoned_final before update on run for each row execute function run_abandoned_final()`.execute(db);

  // Nothing is recorded on an abandoned run any more: its step records stay as they were.
  await sql`
    create function step_record_run_not_abandoned() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if exists (select 1 from run where id = coalesce(new.run_id, old.run_id) and status = 'abandoned') then
        raise exception 'the run is abandoned; its step records can no longer change' using errcode = 'P0001';
      end if;
      return coalesce(new, old);
    end $$`.execute(db);
  await sql`
    create trigger step_record_run_not_abandoned before insert or update or delete on step_record
      for each row execute function step_record_run_not_abandoned()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
