import { type Kysely, sql } from "kysely";

// Cell specifications (datasheet values), stored files, procedures and their versions.
// A released or withdrawn version is frozen by the database itself.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("stored_file")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("storage_key", "text", (c) => c.notNull().unique())
    .addColumn("original_name", "text", (c) => c.notNull())
    .addColumn("content_type", "text", (c) => c.notNull())
    .addColumn("size_bytes", "bigint", (c) => c.notNull().check(sql`size_bytes >= 0`))
    .addColumn("sha256", "text", (c) => c.notNull().check(sql`sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("purpose", "text", (c) => c.notNull())
    .addColumn("uploaded_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("uploaded_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("cell_specification")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("maker", "text", (c) => c.notNull())
    .addColumn("model", "text", (c) => c.notNull())
    .addColumn("designation", "text", (c) => c.notNull())
    .addColumn("data", "jsonb", (c) => c.notNull())
    .addColumn("datasheet_file_id", "uuid", (c) => c.references("stored_file.id"))
    .addColumn("created_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("cell_specification_maker_model_key", ["maker", "model"])
    .execute();

  await db.schema
    .createTable("procedure")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("code", "text", (c) => c.notNull().unique())
    .addColumn("created_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("procedure_version")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("procedure_id", "uuid", (c) => c.notNull().references("procedure.id"))
    .addColumn("number", "integer", (c) => c.notNull().check(sql`number >= 1`))
    .addColumn("status", "text", (c) =>
      c.notNull().defaultTo("draft").check(sql`status in ('draft', 'in_review', 'released', 'withdrawn')`),
    )
    .addColumn("title", "text", (c) => c.notNull())
    .addColumn("definition", "jsonb", (c) => c.notNull())
    // Rich text as ProseMirror documents (JSON), never as HTML: nothing a browser would run is stored.
    .addColumn("instructions_doc", "jsonb")
    .addColumn("cautions_doc", "jsonb")
    .addColumn("acknowledged_cautions", "jsonb", (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn("author_id", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("submitted_by", "text", (c) => c.references("app_user.id"))
    .addColumn("submitted_at", "timestamptz")
    .addColumn("released_by", "text", (c) => c.references("app_user.id"))
    .addColumn("released_at", "timestamptz")
    .addColumn("withdrawn_by", "text", (c) => c.references("app_user.id"))
    .addColumn("withdrawn_at", "timestamptz")
    .addColumn("withdrawal_reason", "text")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("procedure_version_number_key", ["procedure_id", "number"])
    // Release needs a second engineer: never the author, never whoever submitted it for review.
    .addCheckConstraint(
      "procedure_version_second_engineer",
      sql`released_by is null or (released_by <> author_id and released_by is distinct from submitted_by)`,
    )
    .addCheckConstraint(
      "procedure_version_release_stamped",
      sql`status not in ('released', 'withdrawn') or (released_by is not null and released_at is not null)`,
    )
    .addCheckConstraint(
      "procedure_version_withdrawal_reason",
      sql`status <> 'withdrawn' or (withdrawn_by is not null and length(trim(withdrawal_reason)) > 0)`,
    )
    .execute();
  // At most one open draft or review per procedure, so "edit" always means one place.
  await sql`create unique index procedure_version_one_open on procedure_version (procedure_id)
    where status in ('draft', 'in_review')`.execute(db);

  await sql`
    create function procedure_version_guard() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' then
        if old.status <> 'draft' then
          raise exception 'procedure version % is %: only drafts can be deleted', old.number, old.status using errcode = 'P0001';
        end if;
        return old;
      end if;
      if old.status = 'withdrawn' then
        raise exception 'procedure version % is withdrawn and frozen', old.number using errcode = 'P0001';
      end if;
      if old.status = 'released' then
        -- The only change a released version accepts is its withdrawal; its content never changes.
        if new.status <> 'withdrawn'
           or (new.title, new.definition, new.instructions_doc, new.cautions_doc, new.acknowledged_cautions,
               new.author_id, new.submitted_by, new.submitted_at, new.released_by, new.released_at, new.number, new.procedure_id)
              is distinct from
              (old.title, old.definition, old.instructions_doc, old.cautions_doc, old.acknowledged_cautions,
               old.author_id, old.submitted_by, old.submitted_at, old.released_by, old.released_at, old.number, old.procedure_id)
        then
          raise exception 'procedure version % is released and frozen: start a new draft to change it', old.number using errcode = 'P0001';
        end if;
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger procedure_version_frozen before update or delete on procedure_version
    for each row execute function procedure_version_guard()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
