import { type Kysely, sql } from "kysely";

// Releasing a procedure version is an electronic signature (21 CFR 11.50: printed name, date and time,
// meaning "approved for use"), linked to the version by the SHA-256 of its content; and a new outbox
// kind tells engineers that a version waits for their release.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table electronic_signature drop constraint electronic_signature_meaning_check`.execute(db);
  await sql`alter table electronic_signature add constraint electronic_signature_meaning_check
    check (meaning in ('reviewed', 'approved', 'released'))`.execute(db);
  await sql`alter table electronic_signature drop constraint electronic_signature_entity_type_check`.execute(db);
  await sql`alter table electronic_signature add constraint electronic_signature_entity_type_check
    check (entity_type in ('run', 'certificate', 'procedure-version'))`.execute(db);

  // A release signature belongs to a version in review, and never to its author or whoever submitted it.
  // Its own trigger, beside the append-only guard of 0005, so the two never have to be edited together.
  await sql`
    create function procedure_release_signature_guard() returns trigger language plpgsql set search_path = public, pg_temp as $$
    declare v record;
    begin
      if new.entity_type <> 'procedure-version' and new.meaning <> 'released' then
        return new;
      end if;
      if new.entity_type <> 'procedure-version' or new.meaning <> 'released' then
        raise exception 'only a procedure version is signed as released' using errcode = 'P0001';
      end if;
      select author_id, submitted_by, status into v from procedure_version where id = new.entity_id;
      if not found then
        raise exception 'no procedure version % to sign', new.entity_id using errcode = 'P0001';
      end if;
      if v.status <> 'in_review' then
        raise exception 'only a procedure version in review can be signed as released' using errcode = 'P0001';
      end if;
      if v.author_id = new.signer_id or v.submitted_by = new.signer_id then
        raise exception 'a second engineer must release a procedure version' using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger electronic_signature_release before insert on electronic_signature
    for each row execute function procedure_release_signature_guard()`.execute(db);

  await sql`alter table mail_message drop constraint mail_message_kind_check`.execute(db);
  await sql`alter table mail_message add constraint mail_message_kind_check
    check (kind in ('run-submitted', 'run-returned', 'certificate-issued', 'calibration-due', 'procedure-awaiting-release'))`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
