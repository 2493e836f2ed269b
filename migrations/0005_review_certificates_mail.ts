import { type Kysely, sql } from "kysely";

// Review of submitted runs, electronic signatures (21 CFR 11.50/11.70: printed name, date and time,
// meaning, linked to the record by its hash), issued certificates (ISO/IEC 17025:2017 7.8; amendments
// name the certificate they replace, 7.8.8) and the e-mail outbox (a message is written in the same
// transaction as the change that causes it and sent afterwards, so a failed send never loses the change).
export async function up(db: Kysely<any>): Promise<void> {
  // 7.8.2.1 e: the customer, where the work is done for one. In-house work leaves it empty.
  await db.schema.alterTable("lot").addColumn("customer", "text").execute();

  await db.schema
    .createTable("electronic_signature")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("signer_id", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("printed_name", "text", (c) => c.notNull().check(sql`length(trim(printed_name)) > 0`))
    .addColumn("meaning", "text", (c) => c.notNull().check(sql`meaning in ('reviewed', 'approved')`))
    .addColumn("signed_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("entity_type", "text", (c) => c.notNull().check(sql`entity_type in ('run', 'certificate')`))
    .addColumn("entity_id", "uuid", (c) => c.notNull())
    // SHA-256 of the canonical content signed: the signature cannot be moved to another record.
    .addColumn("record_sha256", "text", (c) => c.notNull().check(sql`record_sha256 ~ '^[0-9a-f]{64}$'`))
    // One signature of each meaning per record: signing twice is refused here too.
    .addUniqueConstraint("electronic_signature_once", ["entity_type", "entity_id", "meaning"])
    .execute();

  // The operator of a run never signs for it (docs/design.md §2), whatever the code above does.
  await sql`
    create function electronic_signature_guard() returns trigger language plpgsql as $$
    declare run_operator text;
    begin
      if tg_op <> 'INSERT' then
        raise exception 'electronic signatures are never changed or deleted' using errcode = 'P0001';
      end if;
      if new.entity_type = 'run' then
        select operator_id into run_operator from run where id = new.entity_id;
        if run_operator is null then
          raise exception 'no run % to sign', new.entity_id using errcode = 'P0001';
        end if;
        if run_operator = new.signer_id then
          raise exception 'the operator of a run cannot sign for it' using errcode = 'P0001';
        end if;
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger electronic_signature_append_only before insert or update or delete on electronic_signature
    for each row execute function electronic_signature_guard()`.execute(db);

  await db.schema
    .createTable("run_review")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("run_id", "uuid", (c) => c.notNull().references("run.id"))
    .addColumn("reviewer_id", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("decision", "text", (c) => c.notNull().check(sql`decision in ('returned', 'accepted')`))
    .addColumn("comments", "text", (c) => c.notNull().defaultTo(""))
    // The evaluation the reviewer looked at, and their note on each deviating finding of it.
    .addColumn("run_evaluation_id", "uuid", (c) => c.references("run_evaluation.id"))
    .addColumn("acknowledged_deviations", "jsonb", (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn("signature_id", "uuid", (c) => c.references("electronic_signature.id").unique())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("run_review_return_says_why", sql`decision <> 'returned' or length(trim(comments)) > 0`)
    .addCheckConstraint("run_review_accept_is_signed", sql`decision <> 'accepted' or (signature_id is not null and run_evaluation_id is not null)`)
    .execute();
  await db.schema.createIndex("run_review_run_idx").on("run_review").columns(["run_id", "created_at"]).execute();
  await sql`
    create function run_review_guard() returns trigger language plpgsql as $$
    declare run_operator text;
    begin
      if tg_op <> 'INSERT' then
        raise exception 'reviews are never changed or deleted' using errcode = 'P0001';
      end if;
      select operator_id into run_operator from run where id = new.run_id;
      if run_operator = new.reviewer_id then
        raise exception 'the operator of a run cannot review it' using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger run_review_append_only before insert or update or delete on run_review
    for each row execute function run_review_guard()`.execute(db);

  await sql`create sequence certificate_number_seq`.execute(db);
  await db.schema
    .createTable("certificate")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("number", "text", (c) => c.notNull().unique().defaultTo(sql`'C-' || lpad(nextval('certificate_number_seq')::text, 5, '0')`))
    .addColumn("run_id", "uuid", (c) => c.references("run.id"))
    .addColumn("lot_id", "uuid", (c) => c.references("lot.id"))
    // An amendment (7.8.8) names the one certificate it replaces, and says why.
    .addColumn("replaces_id", "uuid", (c) => c.references("certificate.id").unique())
    .addColumn("amendment_reason", "text")
    // What the certificate states, as canonical JSON, and the SHA-256 of that JSON.
    .addColumn("payload", "jsonb", (c) => c.notNull())
    .addColumn("payload_sha256", "text", (c) => c.notNull().check(sql`payload_sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("pdf_file_id", "uuid", (c) => c.notNull().references("stored_file.id"))
    .addColumn("pdf_sha256", "text", (c) => c.notNull().check(sql`pdf_sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("issued_by", "text", (c) => c.notNull().references("app_user.id"))
    .addColumn("issued_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("signature_id", "uuid", (c) => c.notNull().references("electronic_signature.id").unique())
    .addColumn("revoked_at", "timestamptz")
    .addColumn("revoked_by", "text", (c) => c.references("app_user.id"))
    .addColumn("revocation_reason", "text")
    .addCheckConstraint("certificate_one_subject", sql`(run_id is null) <> (lot_id is null)`)
    .addCheckConstraint("certificate_amendment_says_why", sql`(replaces_id is null) = (amendment_reason is null) and (amendment_reason is null or length(trim(amendment_reason)) > 0)`)
    .addCheckConstraint(
      "certificate_revocation_complete",
      sql`(revoked_at is null) = (revoked_by is null) and (revoked_at is null) = (revocation_reason is null) and (revocation_reason is null or length(trim(revocation_reason)) > 0)`,
    )
    .execute();
  await db.schema.createIndex("certificate_run_idx").on("certificate").column("run_id").execute();
  await db.schema.createIndex("certificate_lot_idx").on("certificate").column("lot_id").execute();
  await db.schema.createIndex("certificate_issued_idx").on("certificate").column("issued_at").execute();

  // Once issued, what a certificate states and its PDF never change; only a revocation may be added, once.
  await sql`
    create function certificate_guard() returns trigger language plpgsql as $$
    declare run_operator text;
    begin
      if tg_op = 'DELETE' then
        raise exception 'certificate % is issued and cannot be deleted', old.number using errcode = 'P0001';
      elsif tg_op = 'INSERT' then
        if new.run_id is not null then
          select operator_id into run_operator from run where id = new.run_id;
          if run_operator = new.issued_by then
            raise exception 'the operator of a run cannot issue its certificate' using errcode = 'P0001';
          end if;
        end if;
        return new;
      end if;
      if (new.number, new.run_id, new.lot_id, new.replaces_id, new.amendment_reason, new.payload, new.payload_sha256,
          new.pdf_file_id, new.pdf_sha256, new.issued_by, new.issued_at, new.signature_id)
         is distinct from
         (old.number, old.run_id, old.lot_id, old.replaces_id, old.amendment_reason, old.payload, old.payload_sha256,
          old.pdf_file_id, old.pdf_sha256, old.issued_by, old.issued_at, old.signature_id) then
        raise exception 'certificate % is issued: what it states and its PDF never change', old.number using errcode = 'P0001';
      end if;
      if old.revoked_at is not null then
        raise exception 'certificate % is already revoked', old.number using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger certificate_frozen before insert or update or delete on certificate
    for each row execute function certificate_guard()`.execute(db);

  await db.schema
    .createTable("mail_message")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("kind", "text", (c) =>
      c.notNull().check(sql`kind in ('run-submitted', 'run-returned', 'certificate-issued', 'calibration-due')`),
    )
    .addColumn("recipients", sql`text[]`, (c) => c.notNull().check(sql`cardinality(recipients) > 0`))
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("entity_type", "text")
    .addColumn("entity_id", "text")
    // Messages that must go once only (a calibration reminder per instrument and due date).
    .addColumn("once_key", "text", (c) => c.unique())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("next_attempt_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("sent_at", "timestamptz")
    .addColumn("last_error", "text")
    .addColumn("smtp_message_id", "text")
    .execute();
  await sql`create index mail_message_pending_idx on mail_message (next_attempt_at) where sent_at is null`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
