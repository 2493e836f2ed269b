import { type Kysely, sql } from "kysely";

// The audit trail becomes a hash chain (docs/decisions/006): each row carries its place in the chain,
// the previous row's hash and its own hash over (previous hash + its content). The trigger that sets
// them holds one transaction-wide lock, so concurrent inserts queue up and the chain stays linear.
// `npm run verify` recomputes every hash and names the first row whose content or link does not match.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table audit_event add column chain_position bigint, add column prev_hash text, add column row_hash text`.execute(db);

  // What a row's hash covers, written out one way: jsonb's text form is canonical (keys sorted, one
  // spacing) and the time is spelled in UTC, so the text does not depend on the session's settings.
  await sql`
    create function audit_event_content(e audit_event) returns text language sql stable
    set search_path = pg_catalog, public as $$
      select jsonb_build_array(e.id, e.chain_position, to_char(e.at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"'),
        e.actor_id, e.actor_label, e.action, e.entity_type, e.entity_id, e.before, e.after, e.detail, e.address)::text
    $$`.execute(db);
  await sql`
    create function audit_event_chain_hash(prev_hash text, e audit_event) returns text language sql stable
    set search_path = pg_catalog, public as $$
      select encode(sha256(convert_to(prev_hash || audit_event_content(e), 'UTF8')), 'hex')
    $$`.execute(db);

  // Chain the rows an older database already holds, in insertion order (their ids). The append-only
  // trigger is lifted for this one update, inside the migration's transaction, and put back.
  await sql`alter table audit_event disable trigger audit_event_no_update_delete`.execute(db);
  await sql`
    do $$
    declare
      r audit_event;
      prev text := repeat('0', 64);
      pos bigint := 0;
    begin
      for r in select * from audit_event order by id loop
        pos := pos + 1;
        r.chain_position := pos;
        r.prev_hash := prev;
        r.row_hash := audit_event_chain_hash(prev, r);
        update audit_event set chain_position = r.chain_position, prev_hash = r.prev_hash, row_hash = r.row_hash where id = r.id;
        prev := r.row_hash;
      end loop;
    end $$`.execute(db);
  await sql`alter table audit_event enable trigger audit_event_no_update_delete`.execute(db);

  await sql`alter table audit_event alter column chain_position set not null, alter column prev_hash set not null, alter column row_hash set not null`.execute(db);
  await sql`alter table audit_event add constraint audit_event_chain_position_key unique (chain_position)`.execute(db);
  await sql`alter table audit_event add constraint audit_event_hashes_hex check (prev_hash ~ '^[0-9a-f]{64}$' and row_hash ~ '^[0-9a-f]{64}$')`.execute(db);

  // Runs as the migration's owner (security definer) so an app role with INSERT alone can append.
  // Whatever the client sends for the three chain columns is overwritten.
  await sql`
    create function audit_event_chain() returns trigger language plpgsql security definer
    set search_path = pg_catalog, public as $$
    declare
      last audit_event;
    begin
      -- One chain, one writer at a time: held until this transaction ends, so the next insert sees this row.
      perform pg_advisory_xact_lock(hashtext('cellwright.audit_event.chain'));
      select * into last from audit_event order by chain_position desc limit 1;
      new.chain_position := coalesce(last.chain_position, 0) + 1;
      new.prev_hash := coalesce(last.row_hash, repeat('0', 64));
      new.row_hash := audit_event_chain_hash(new.prev_hash, new);
      return new;
    end $$`.execute(db);
  await sql`create trigger audit_event_chain before insert on audit_event for each row execute function audit_event_chain()`.execute(db);
}

export async function down(): Promise<void> {
  throw new Error("migrations are forward-only");
}
