import { type Kysely, sql } from "kysely";

// The lab's signing key lives in the database, so every app server signs with the same key and none
// keeps it on its own disk. The PKCS#12 file and its passphrase are stored sealed (AES-256-GCM under a
// key from the servers' environment, lib/certificates/sealed-secret.ts); what the admin page shows
// (subject, fingerprint, validity) is kept beside them in the clear. One key per installation: a key once
// stored is never changed or removed (certificates signed with it must keep matching the check page);
// the app may read it and store the first one, nothing else.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table lab_signing_key (
      id uuid primary key,
      origin text not null check (origin in ('generated', 'imported')),
      sealed_p12 bytea not null,
      sealed_passphrase bytea not null,
      sealing_key_name text not null,
      p12_sha256 text not null check (p12_sha256 ~ '^[0-9a-f]{64}$'),
      certificate_sha256 text not null check (certificate_sha256 ~ '^[0-9a-f]{64}$'),
      subject text not null,
      valid_from timestamptz not null,
      valid_to timestamptz not null,
      created_at timestamptz not null default now()
    )`.execute(db);
  // One row at most: two servers storing their first key at once end with one key (the second insert conflicts).
  await sql`create unique index lab_signing_key_one on lab_signing_key ((true))`.execute(db);

  await sql`
    create function lab_signing_key_guard() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      raise exception 'the lab signing key is never changed or removed once stored' using errcode = 'P0001';
    end $$`.execute(db);
  await sql`create trigger lab_signing_key_kept before update or delete on lab_signing_key
    for each row execute function lab_signing_key_guard()`.execute(db);
  await sql`create trigger lab_signing_key_no_truncate before truncate on lab_signing_key
    for each statement execute function lab_signing_key_guard()`.execute(db);

  // 0007's default privileges gave the app S I U D: it reads the key and stores the first one.
  await sql`revoke update, delete, truncate, references, trigger on lab_signing_key from cellwright_app`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
