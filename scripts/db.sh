#!/usr/bin/env bash
# Project-local PostgreSQL on loopback: `db.sh start|stop|status [demo|test]`.
# Initialises the cluster under .data/ on first use and installs Debian's server if it is missing.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cmd="${1:-start}"
cw_profile "${2:-demo}"

pg_bin() {
  local bin
  bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1 || true)
  if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then
    log "PostgreSQL server not found: installing Debian's postgresql package" >&2
    apt_install postgresql >&2
    bin=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1)
  fi
  echo "$bin"
}

# initdb refuses to run as root, so the server tools run as Debian's postgres user, from / (it may not be
# able to enter the clone it was called from).
as_pg() { if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi; }

start() {
  local bin; bin=$(pg_bin)
  if [ "$(id -u)" = 0 ]; then
    install -d -o postgres -m 700 "$PG_DATA" "$PG_SOCK"
    # A cluster kept under .data/ (made before clusters moved out of clones run as root) needs .data traversable.
    case "$PG_DATA" in "$ROOT"/*) chmod o+x "$ROOT/.data" ;; esac
  else
    install -d -m 700 "$PG_DATA" "$PG_SOCK"
  fi
  if [ ! -f "$PG_DATA/PG_VERSION" ]; then
    log "initialising PostgreSQL cluster in $PG_DATA"
    as_pg "$bin/initdb" -D "$PG_DATA" -U postgres --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if as_pg "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then
    echo "PostgreSQL already running on 127.0.0.1:$PG_PORT"
  else
    local extra=""
    # The test cluster trades durability for speed; the demo and the benchmark keep fsync on.
    [ "$PG_DB" = cellwright_test ] && extra="-c fsync=off -c synchronous_commit=off -c full_page_writes=off"
    as_pg "$bin/pg_ctl" -D "$PG_DATA" -l "$PG_DATA/server.log" -w -t 30 \
      -o "-c listen_addresses=127.0.0.1 -p $PG_PORT -k $PG_SOCK $extra" start >/dev/null
    echo "PostgreSQL started on 127.0.0.1:$PG_PORT"
  fi
  ensure_roles "$bin"
}

# Over TCP every role signs in with its password; the socket (a folder only the server's owner and root
# can enter) is how this script reaches the superuser to set those passwords.
HBA="# Written by scripts/db.sh: the socket folder is private (mode 700); over TCP, passwords.
local all all trust
host all all 127.0.0.1/32 scram-sha-256
host all all ::1/128 scram-sha-256"

as_superuser() { "$1/psql" -h "$PG_SOCK" -p "$PG_PORT" -U postgres -X -v ON_ERROR_STOP=1 -Atq "${@:2}"; }

# The owner role owns the database, its schema objects and runs the migrations; the app role only gets
# what migration 0007 grants. Neither is a superuser. Safe to run on every start.
ensure_roles() {
  local bin="$1"
  if [ "$(as_pg cat "$PG_DATA/pg_hba.conf")" != "$HBA" ]; then
    printf '%s\n' "$HBA" | as_pg tee "$PG_DATA/pg_hba.conf" >/dev/null
    as_pg "$bin/pg_ctl" -D "$PG_DATA" reload >/dev/null
  fi
  # Passwords go through stdin, never on a command line.
  as_superuser "$bin" -d postgres <<SQL
\\set su_pw '$(sql_quote "$DB_SUPERUSER_PASSWORD")'
\\set owner_pw '$(sql_quote "$DB_OWNER_PASSWORD")'
\\set app_pw '$(sql_quote "$DB_APP_PASSWORD")'
select format('create role %I', r) from unnest(array['cellwright_owner', 'cellwright_app']) r
 where not exists (select 1 from pg_roles where rolname = r) \\gexec
alter role postgres password :'su_pw';
alter role cellwright_owner with login nosuperuser nocreatedb nocreaterole noreplication nobypassrls inherit password :'owner_pw';
alter role cellwright_app with login nosuperuser nocreatedb nocreaterole noreplication nobypassrls noinherit password :'app_pw';
select format('create database %I owner cellwright_owner', '$PG_DB') where not exists (select 1 from pg_database where datname = '$PG_DB') \\gexec
alter database "$PG_DB" owner to cellwright_owner;
SQL
  # A demo made before the roles existed belongs to postgres: hand its objects to the owner role.
  as_superuser "$bin" -d "$PG_DB" <<'SQL'
do $$
declare r record;
begin
  for r in select c.oid::regclass as name, c.relkind from pg_class c join pg_namespace n on n.oid = c.relnamespace
            where n.nspname = 'public' and c.relowner = 'postgres'::regrole and c.relkind in ('r', 'p', 'v', 'm', 'S')
            order by c.relkind = 'S' loop
    -- A sequence owned by a column has moved with its table already.
    if r.relkind <> 'S' or (select relowner from pg_class where oid = r.name) = 'postgres'::regrole
       and not exists (select 1 from pg_depend where objid = r.name and deptype in ('a', 'i')) then
      execute format('alter %s %s owner to cellwright_owner',
        case r.relkind when 'S' then 'sequence' when 'v' then 'view' when 'm' then 'materialized view' else 'table' end, r.name);
    end if;
  end loop;
  for r in select p.oid::regprocedure as name from pg_proc p join pg_namespace n on n.oid = p.pronamespace
            where n.nspname = 'public' and p.proowner = 'postgres'::regrole loop
    execute format('alter routine %s owner to cellwright_owner', r.name);
  end loop;
end $$;
SQL
}

sql_quote() { local s="${1//\\/\\\\}"; printf %s "${s//\'/\'\'}"; }

stop() {
  [ -f "$PG_DATA/PG_VERSION" ] || { echo "no cluster in ${PG_DATA#$ROOT/}"; return 0; }
  local bin; bin=$(pg_bin)
  if as_pg "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then
    as_pg "$bin/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null
    echo "PostgreSQL on port $PG_PORT stopped"
  else
    echo "PostgreSQL on port $PG_PORT was not running"
  fi
}

stop_s3_fake() {
  case "$1" in demo | test | bench) ;; *) return 0 ;; esac
  s3_profile "$1"
  if [ -f "$S3_PID_FILE" ] && kill -0 "$(cat "$S3_PID_FILE")" 2>/dev/null; then
    kill -- -"$(cat "$S3_PID_FILE")" 2>/dev/null || kill "$(cat "$S3_PID_FILE")"
    echo "S3 fake on port $S3_PORT stopped"
  fi
  rm -f "$S3_PID_FILE"
}

stop_mail_catcher() {
  case "$1" in demo | test | bench) ;; *) return 0 ;; esac
  mail_profile "$1"
  if [ -f "$MAIL_PID_FILE" ] && kill -0 "$(cat "$MAIL_PID_FILE")" 2>/dev/null; then
    kill -- -"$(cat "$MAIL_PID_FILE")" 2>/dev/null || kill "$(cat "$MAIL_PID_FILE")"
    echo "mail catcher on port $MAIL_SMTP_PORT stopped"
  fi
  rm -f "$MAIL_PID_FILE"
}

case "$cmd" in
  start) start ;;
  # The log worker first: it needs the database to leave its job in a clean state.
  stop) if [ "${2:-demo}" = test ]; then stop_worker e2e; else stop_worker demo; fi; stop; stop_s3_fake "${2:-demo}"; stop_mail_catcher "${2:-demo}" ;;
  status) as_pg "$(pg_bin)/pg_ctl" -D "$PG_DATA" status ;;
  *) echo "usage: db.sh start|stop|status [demo|test|bench]" >&2; exit 2 ;;
esac
