import { type Kysely, sql } from "kysely";

// Foundation: the lab, users with one role each, sessions, sign-in attempts for rate limiting,
// and the append-only audit trail.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("lab")
    .addColumn("id", "integer", (c) => c.primaryKey().defaultTo(1).check(sql`id = 1`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("address", "text", (c) => c.notNull())
    .addColumn("accreditation", "text")
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("app_user")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("email", "text", (c) => c.notNull().unique().check(sql`email = lower(email)`))
    .addColumn("display_name", "text", (c) => c.notNull())
    .addColumn("role", "text", (c) =>
      c.notNull().check(sql`role in ('admin', 'engineer', 'operator', 'auditor')`),
    )
    .addColumn("password_hash", "text", (c) => c.notNull())
    .addColumn("active", "boolean", (c) => c.notNull().defaultTo(true))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("user_session")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("user_id", "text", (c) => c.notNull().references("app_user.id").onDelete("cascade"))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("user_session_user_id").on("user_session").column("user_id").execute();

  await db.schema
    .createTable("sign_in_attempt")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("address", "text", (c) => c.notNull())
    .addColumn("succeeded", "boolean", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("sign_in_attempt_email_at").on("sign_in_attempt").columns(["email", "at"]).execute();
  await db.schema.createIndex("sign_in_attempt_address_at").on("sign_in_attempt").columns(["address", "at"]).execute();

  await db.schema
    .createTable("audit_event")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("actor_id", "text", (c) => c.references("app_user.id"))
    .addColumn("actor_label", "text", (c) => c.notNull())
    .addColumn("action", "text", (c) => c.notNull())
    .addColumn("entity_type", "text")
    .addColumn("entity_id", "text")
    .addColumn("before", "jsonb")
    .addColumn("after", "jsonb")
    .addColumn("detail", "jsonb")
    .addColumn("address", "text")
    .execute();
  await db.schema.createIndex("audit_event_entity").on("audit_event").columns(["entity_type", "entity_id"]).execute();
  await db.schema.createIndex("audit_event_at").on("audit_event").column("at").execute();

  // The audit trail is evidence: the database itself refuses to change or remove it.
  await sql`
    create function audit_event_refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception 'audit_event is append-only: % refused', tg_op using errcode = 'P0001';
    end $$`.execute(db);
  await sql`
    create trigger audit_event_no_update_delete before update or delete on audit_event
    for each row execute function audit_event_refuse_change()`.execute(db);
  await sql`
    create trigger audit_event_no_truncate before truncate on audit_event
    for each statement execute function audit_event_refuse_change()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
