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

# initdb refuses to run as root, so the server tools run as Debian's postgres user.
as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

start() {
  local bin; bin=$(pg_bin)
  if [ "$(id -u)" = 0 ]; then
    install -d -o postgres -m 700 "$PG_DATA" "$PG_SOCK"
    chmod o+x "$ROOT/.data"
  else
    install -d -m 700 "$PG_DATA" "$PG_SOCK"
  fi
  if [ ! -f "$PG_DATA/PG_VERSION" ]; then
    log "initialising PostgreSQL cluster in ${PG_DATA#$ROOT/}"
    as_pg "$bin/initdb" -D "$PG_DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
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
  if ! "$bin/psql" -h 127.0.0.1 -p "$PG_PORT" -U postgres -Atqc "select 1 from pg_database where datname='$PG_DB'" postgres | grep -q 1; then
    "$bin/createdb" -h 127.0.0.1 -p "$PG_PORT" -U postgres "$PG_DB"
    echo "database $PG_DB created"
  fi
}

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
  case "$1" in demo | test) ;; *) return 0 ;; esac
  s3_profile "$1"
  if [ -f "$S3_PID_FILE" ] && kill -0 "$(cat "$S3_PID_FILE")" 2>/dev/null; then
    kill -- -"$(cat "$S3_PID_FILE")" 2>/dev/null || kill "$(cat "$S3_PID_FILE")"
    echo "S3 fake on port $S3_PORT stopped"
  fi
  rm -f "$S3_PID_FILE"
}

stop_mail_catcher() {
  case "$1" in demo | test) ;; *) return 0 ;; esac
  mail_profile "$1"
  if [ -f "$MAIL_PID_FILE" ] && kill -0 "$(cat "$MAIL_PID_FILE")" 2>/dev/null; then
    kill -- -"$(cat "$MAIL_PID_FILE")" 2>/dev/null || kill "$(cat "$MAIL_PID_FILE")"
    echo "mail catcher on port $MAIL_SMTP_PORT stopped"
  fi
  rm -f "$MAIL_PID_FILE"
}

case "$cmd" in
  start) start ;;
  stop) stop; stop_s3_fake "${2:-demo}"; stop_mail_catcher "${2:-demo}" ;;
  status) as_pg "$(pg_bin)/pg_ctl" -D "$PG_DATA" status ;;
  *) echo "usage: db.sh start|stop|status [demo|test]" >&2; exit 2 ;;
esac
