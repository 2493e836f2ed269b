import { type Kysely, sql } from "kysely";

// 0008 already refuses an evaluation written, changed or removed once its run is accepted
// (run_evaluation_frozen_with_run, with the guard every run-keyed table shares). It reads the run's
// status without a lock, so an evaluation inserted while an acceptance is in flight read the status
// from before it, and landed after the one the reviewer signed for. This guard takes a share lock on
// the run first: it waits for the acceptance (which locks the run row to change its status), then
// sees "accepted" and refuses. Only run_evaluation changes guard: lib/runs/evaluate-stored-run.ts locks
// the run row before it inserts, so the share lock never needs upgrading.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function run_evaluation_guard() returns trigger language plpgsql set search_path = public, pg_temp as $$
    declare
      run_ids uuid[] := '{}';
      frozen_number text;
    begin
      if tg_op in ('UPDATE', 'DELETE') then run_ids := run_ids || old.run_id; end if;
      if tg_op in ('UPDATE', 'INSERT') then run_ids := run_ids || new.run_id; end if;
      perform 1 from run where id = any(run_ids) order by id for share;
      select number into frozen_number from run where id = any(run_ids) and status in ('accepted', 'certified') limit 1;
      if frozen_number is not null then
        raise exception 'run % has been accepted: its records, logs and evaluations are frozen (% refused on %)', frozen_number, tg_op, tg_table_name
          using errcode = 'P0001';
      end if;
      if tg_op = 'DELETE' then return old; end if;
      return new;
    end $$`.execute(db);
  await sql`drop trigger run_evaluation_frozen_with_run on run_evaluation`.execute(db);
  await sql`create trigger run_evaluation_frozen_with_run before insert or update or delete on run_evaluation
    for each row execute function run_evaluation_guard()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
