import { type Kysely, sql } from "kysely";

// Sampling of a lot (ISO 2859-1): the plan chosen for it, the cells drawn (by tray position, with the
// seed of a random draw so anyone can repeat it), and which specimen is which drawn cell.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("lot")
    .addColumn("inspection_level", "text", (c) => c.check(sql`inspection_level in ('S-1', 'S-2', 'S-3', 'S-4', 'I', 'II', 'III')`))
    // AQL as written in the standard's table ("0.65"): text, so no binary fraction ever enters it.
    .addColumn("aql", "text")
    .addColumn("severity", "text", (c) => c.check(sql`severity in ('normal')`))
    // The plan as computed when it was set (code letter, n, Ac, Re, the steps in words).
    .addColumn("sampling_plan", "jsonb")
    // The procedure whose statement of conformity decides each sampled cell.
    .addColumn("acceptance_procedure_id", "uuid", (c) => c.references("procedure.id"))
    .addColumn("plan_set_by", "text", (c) => c.references("app_user.id"))
    .addColumn("plan_set_at", "timestamptz")
    .execute();
  await sql`alter table lot add constraint lot_plan_complete check (
    (sampling_plan is null) = (inspection_level is null) and (sampling_plan is null) = (aql is null)
    and (sampling_plan is null) = (severity is null) and (sampling_plan is null) = (plan_set_at is null))`.execute(db);

  await db.schema
    .createTable("lot_sample_draw")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    // One draw per lot: the sample, once drawn, is the sample.
    .addColumn("lot_id", "uuid", (c) => c.notNull().unique().references("lot.id"))
    .addColumn("method", "text", (c) => c.notNull().check(sql`method in ('random', 'chosen')`))
    .addColumn("seed", "text")
    // Tray positions 1…lot size of the cells drawn, in the order drawn.
    .addColumn("positions", sql`integer[]`, (c) => c.notNull().check(sql`cardinality(positions) > 0`))
    .addColumn("drawn_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("drawn_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("lot_sample_draw_seed", sql`(method = 'random') = (seed is not null)`)
    .execute();
  await sql`
    create function lot_sample_draw_guard() returns trigger language plpgsql as $$
    begin
      raise exception 'a drawn sample is never changed or deleted' using errcode = 'P0001';
    end $$`.execute(db);
  await sql`create trigger lot_sample_draw_frozen before update or delete on lot_sample_draw
    for each row execute function lot_sample_draw_guard()`.execute(db);

  await db.schema
    .alterTable("specimen")
    .addColumn("lot_position", "integer", (c) => c.check(sql`lot_position >= 1`))
    .execute();
  await sql`create unique index specimen_lot_position_key on specimen (lot_id, lot_position) where lot_position is not null`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
