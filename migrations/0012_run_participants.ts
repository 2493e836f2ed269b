import { type Kysely, sql } from "kysely";

// Separation of duties (docs/design.md §2, ISO/IEC 17025 7.8.1.1 review by someone other than the tester):
// everyone who took part in a run (started it, recorded a step, uploaded a log, submitted it) is
// written down here by the database itself, and nobody listed may review it, sign for it or issue
// its certificate. Not only the starter: a second operator who recorded steps is a tester too.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("run_participant")
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("user_id", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("activity", "text", (c) => c.notNull().check(sql`activity in ('started', 'recorded', 'uploaded', 'submitted')`))
    .addColumn("first_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("run_participant_pkey", ["run_id", "user_id", "activity"])
    .execute();
  await db.schema.createIndex("run_participant_user_idx").on("run_participant").columns(["user_id", "run_id"]).execute();

  // Taking part is a fact: once written it is never changed or removed.
  await sql`
    create function run_participant_guard() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      raise exception 'who took part in a run is never changed or deleted' using errcode = 'P0001';
    end $$`.execute(db);
  await sql`create trigger run_participant_append_only before update or delete on run_participant
    for each row execute function run_participant_guard()`.execute(db);

  await sql`
    create function note_run_participant(p_run uuid, p_user text, p_activity text) returns void language sql set search_path = public, pg_temp as $$
      insert into run_participant (run_id, user_id, activity) values (p_run, p_user, p_activity) on conflict do nothing
    $$`.execute(db);

  // Written by the database from the records themselves, so no code path can forget it.
  await sql`
    create function run_participant_from_record() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if tg_table_name = 'run' then
        perform note_run_participant(new.id, new.operator_id, 'started');
      elsif tg_table_name = 'step_record' then
        perform note_run_participant(new.run_id, new.recorded_by, 'recorded');
      elsif tg_table_name = 'run_log' then
        perform note_run_participant(new.run_id, new.uploaded_by, 'uploaded');
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_participant_started after insert on run
    for each row execute function run_participant_from_record()`.execute(db);
  await sql`create trigger run_participant_recorded after insert or update of recorded_by on step_record
    for each row execute function run_participant_from_record()`.execute(db);
  await sql`create trigger run_participant_uploaded after insert on run_log
    for each row execute function run_participant_from_record()`.execute(db);

  // Nobody who took part reviews, signs for or issues the certificate of the run.
  await sql`
    create function run_participant_may_not_decide() returns trigger language plpgsql set search_path = public, pg_temp as $$
    declare v_run uuid; v_user text;
    begin
      if tg_table_name = 'run_review' then
        v_run := new.run_id; v_user := new.reviewer_id;
      elsif tg_table_name = 'electronic_signature' then
        if new.entity_type <> 'run' then return new; end if;
        v_run := new.entity_id::uuid; v_user := new.signer_id;
      elsif tg_table_name = 'certificate' then
        if new.run_id is null then return new; end if;
        v_run := new.run_id; v_user := new.issued_by;
      end if;
      if exists (select 1 from run_participant where run_id = v_run and user_id = v_user) then
        raise exception 'someone who took part in a run cannot review, sign or certify it' using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  for (const table of ["run_review", "electronic_signature", "certificate"]) {
    await sql`create trigger ${sql.raw(`${table}_not_by_participant`)} before insert on ${sql.table(table)}
      for each row execute function run_participant_may_not_decide()`.execute(db);
  }

  // Runs recorded before this migration: their operators, recorders, uploaders and submitters.
  await sql`insert into run_participant (run_id, user_id, activity, first_at) select id, operator_id, 'started', created_at from run on conflict do nothing`.execute(db);
  await sql`insert into run_participant (run_id, user_id, activity, first_at) select run_id, recorded_by, 'recorded', min(updated_at) from step_record group by 1, 2 on conflict do nothing`.execute(db);
  await sql`insert into run_participant (run_id, user_id, activity, first_at) select run_id, uploaded_by, 'uploaded', min(uploaded_at) from run_log group by 1, 2 on conflict do nothing`.execute(db);
  await sql`insert into run_participant (run_id, user_id, activity, first_at)
    select entity_id::uuid, actor_id, 'submitted', min(at) from audit_event
    where action = 'run.submit' and entity_type = 'run' and actor_id is not null group by 1, 2 on conflict do nothing`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
