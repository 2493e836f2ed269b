import { type Kysely, sql } from "kysely";

// The instrument register (with calibration dates), lots as received, and specimens. A specimen of
// a lot is of the lot's cell specification: the services check it, and the database does too.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("instrument")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("identifier", "text", (c) => c.notNull())
    .addColumn("serial", "text", (c) => c.notNull())
    .addColumn("firmware", "text")
    .addColumn("accuracy", "jsonb", (c) => c.notNull())
    .addColumn("calibration_certificate", "text", (c) => c.notNull())
    .addColumn("calibrated_on", "date", (c) => c.notNull())
    .addColumn("due_on", "date", (c) => c.notNull())
    .addColumn("active", "boolean", (c) => c.notNull().defaultTo(true))
    // A cycler channel's saved CSV column mapping, offered again at the next log upload.
    .addColumn("log_mapping", "jsonb")
    .addColumn("created_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("instrument_identifier_key", ["identifier"])
    .addCheckConstraint(
      "instrument_kind_known",
      sql`kind in ('cycler-channel', 'thermometer', 'climate-chamber', 'balance', 'resistance-meter')`,
    )
    .addCheckConstraint("instrument_due_after_calibration", sql`due_on > calibrated_on`)
    .execute();

  await db.schema
    .createTable("lot")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("identifier", "text", (c) => c.notNull())
    .addColumn("cell_specification_id", "uuid", (c) => c.notNull().references("cell_specification.id"))
    .addColumn("supplier", "text", (c) => c.notNull())
    .addColumn("quantity_received", "integer", (c) => c.notNull())
    .addColumn("received_on", "date", (c) => c.notNull())
    .addColumn("notes", "text")
    .addColumn("created_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("lot_identifier_key", ["identifier"])
    .addCheckConstraint("lot_quantity_received_positive", sql`quantity_received > 0`)
    .execute();
  await db.schema.createIndex("lot_cell_specification_idx").on("lot").column("cell_specification_id").execute();

  await db.schema
    .createTable("specimen")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("identifier", "text", (c) => c.notNull())
    .addColumn("cell_specification_id", "uuid", (c) => c.notNull().references("cell_specification.id"))
    .addColumn("lot_id", "uuid", (c) => c.references("lot.id"))
    .addColumn("received_on", "date", (c) => c.notNull())
    .addColumn("condition_on_receipt", "text", (c) => c.notNull())
    .addColumn("notes", "text")
    .addColumn("created_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("specimen_identifier_key", ["identifier"])
    .execute();
  await db.schema.createIndex("specimen_lot_idx").on("specimen").column("lot_id").execute();
  await db.schema.createIndex("specimen_cell_specification_idx").on("specimen").column("cell_specification_id").execute();

  // FOR SHARE holds the lot's row until the specimen's transaction ends, so a concurrent change of
  // the lot's specification waits and then sees this specimen (and the lot trigger refuses it).
  await sql`
    create function specimen_matches_lot() returns trigger language plpgsql as $$
    declare lot_spec uuid;
    begin
      if new.lot_id is null then
        return new;
      end if;
      select cell_specification_id into lot_spec from lot where id = new.lot_id for share;
      if found and lot_spec <> new.cell_specification_id then
        raise exception 'specimen % is of another cell specification than its lot', new.identifier using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger specimen_lot_specification before insert or update of lot_id, cell_specification_id on specimen
    for each row execute function specimen_matches_lot()`.execute(db);

  await sql`
    create function lot_keeps_specimens_matching() returns trigger language plpgsql as $$
    begin
      if exists (select 1 from specimen where lot_id = new.id and cell_specification_id <> new.cell_specification_id) then
        raise exception 'lot % has specimens of its present cell specification: its specification cannot change', new.identifier using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger lot_specification_of_specimens before update of cell_specification_id on lot
    for each row execute function lot_keeps_specimens_matching()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
