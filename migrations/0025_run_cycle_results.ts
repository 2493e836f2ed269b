import { type Kysely, sql } from "kysely";

// Per-cycle results of a run, computed while its log is read (lib/analysis/cycle-accumulator.ts): one row
// per cycle, and the accumulator's small state per run so the next log part continues where the last one
// ended. Both are written in the same transaction as the samples that produced them, so a cycle row never
// exists without its samples, nor samples without their cycles.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table run_cycle_result (
      run_id uuid not null references run(id),
      cycle integer not null check (cycle >= 1),
      run_log_id uuid not null references run_log(id),
      charge_ah double precision not null check (charge_ah >= 0),
      discharge_ah double precision not null check (discharge_ah >= 0),
      charge_wh double precision not null check (charge_wh >= 0),
      discharge_wh double precision not null check (discharge_wh >= 0),
      coulombic_efficiency double precision,
      energy_efficiency double precision,
      end_of_charge_v double precision,
      end_of_discharge_v double precision,
      dc_resistance_ohm double precision,
      first_time_s double precision not null,
      last_time_s double precision not null,
      closed boolean not null,
      updated_at timestamptz not null default now(),
      primary key (run_id, cycle),
      constraint run_cycle_result_span check (last_time_s >= first_time_s)
    )`.execute(db);

  await sql`
    create table run_cycle_state (
      run_id uuid primary key references run(id),
      run_log_id uuid not null references run_log(id),
      state jsonb not null,
      sample_count bigint not null check (sample_count >= 0),
      last_sample_time_s double precision,
      samples_arrived_at timestamptz not null default now(),
      stop_reached_cycle integer check (stop_reached_cycle >= 1),
      updated_at timestamptz not null default now()
    )`.execute(db);

  for (const table of ["run_cycle_result", "run_cycle_state"]) {
    await sql`create trigger ${sql.id(`${table}_frozen_with_run`)} before insert or update or delete on ${sql.table(table)}
      for each row execute function run_evidence_guard('run_id')`.execute(db);
  }

  // Two notices of an endurance run: its stop criterion met, and no samples for hours. The list is read
  // from the constraint as it stands, so kinds another migration added stay allowed.
  const { rows } = await sql<{ def: string }>`
    select pg_get_constraintdef(oid) as def from pg_constraint where conname = 'mail_message_kind_check'`.execute(db);
  const existing = [...(rows[0]?.def ?? "").matchAll(/'([a-z-]+)'/g)].map((m) => m[1] as string);
  const kinds = [...new Set([...existing, "endurance-stop-reached", "run-stalled"])];
  await sql`alter table mail_message drop constraint mail_message_kind_check`.execute(db);
  await sql`alter table mail_message add constraint mail_message_kind_check check (kind in (${sql.join(kinds.map((k) => sql.lit(k)))}))`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
