import { type Kysely, sql } from "kysely";

// A cycler PC pushes log parts with a token an administrator issued for one cycler channel. Only the
// SHA-256 of the token is kept (the token is 32 random bytes: a hash lookup is enough, nothing to slow
// down against guessing). A token is issued once, may be revoked once with a reason, and its secret, its
// channel, its issuer and its expiry never change. The per-token request count of the current minute
// lives on the row itself, so every app server counts against the same limit.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table machine_token (
      id uuid primary key default gen_random_uuid(),
      instrument_id uuid not null references instrument(id),
      label text not null check (length(label) between 1 and 100),
      secret_sha256 text not null unique check (secret_sha256 ~ '^[0-9a-f]{64}$'),
      hint text not null check (length(hint) between 4 and 16),
      issued_by text not null references app_user(id),
      issued_at timestamptz not null default now(),
      expires_at timestamptz not null,
      revoked_at timestamptz,
      revoked_by text references app_user(id),
      revoke_reason text check (length(revoke_reason) between 1 and 500),
      last_used_at timestamptz,
      window_start timestamptz,
      window_count integer not null default 0 check (window_count >= 0),
      constraint machine_token_expiry check (expires_at > issued_at and expires_at <= issued_at + interval '366 days'),
      constraint machine_token_revoked check (
        (revoked_at is null) = (revoked_by is null) and (revoked_at is null) = (revoke_reason is null)
      )
    )`.execute(db);
  await sql`create index machine_token_by_instrument on machine_token (instrument_id, issued_at desc)`.execute(db);

  // What a token is (its secret, channel, issuer, expiry) never changes; a revocation is final.
  await sql`
    create function machine_token_guard() returns trigger language plpgsql set search_path = public, pg_temp as $$
    begin
      if tg_op = 'DELETE' then
        raise exception 'an issued token is kept for the record; revoke it instead' using errcode = 'P0001';
      end if;
      if new.secret_sha256 <> old.secret_sha256 or new.instrument_id <> old.instrument_id or new.label <> old.label
         or new.hint <> old.hint or new.issued_by <> old.issued_by or new.issued_at <> old.issued_at
         or new.expires_at <> old.expires_at then
        raise exception 'an issued token cannot be changed; revoke it and issue another' using errcode = 'P0001';
      end if;
      if old.revoked_at is not null and (new.revoked_at is distinct from old.revoked_at
         or new.revoked_by is distinct from old.revoked_by or new.revoke_reason is distinct from old.revoke_reason) then
        raise exception 'this token is already revoked' using errcode = 'P0001';
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger machine_token_kept before update or delete on machine_token for each row execute function machine_token_guard()`.execute(db);

  // A part or a queued job sent with a token names a token that exists (0023 made the columns before this table).
  await sql`alter table run_log_part add constraint run_log_part_machine_token_fk foreign key (machine_token_id) references machine_token(id)`.execute(db);
  await sql`alter table log_ingest_job add constraint log_ingest_job_machine_token_fk foreign key (machine_token_id) references machine_token(id)`.execute(db);

  // The app issues, revokes and counts use; it never deletes a token.
  await sql`revoke all on machine_token from cellwright_app`.execute(db);
  await sql`grant select, insert, update on machine_token to cellwright_app`.execute(db);

  // Requests with an unknown token are tallied like refused cross-site writes: counted per window and
  // address, audited once per window, so guessing floods a count, not the audit trail.
  await sql`alter table refused_request_tally drop constraint refused_request_tally_kind_check`.execute(db);
  await sql`alter table refused_request_tally add constraint refused_request_tally_kind_check check (kind in ('foreign-origin', 'unknown-token'))`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
