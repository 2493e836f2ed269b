#!/usr/bin/env bash
# Proves the database scripts work from a clone the postgres user cannot enter (a clone in /root, mode
# 700): copies scripts/ into a fresh mode-700 folder in root's home (so the postgres user cannot enter it), starts that copy's test cluster,
# signs in as the app role over TCP, stops it and removes everything it made. Root only (elsewhere the
# server runs as the clone's own user and nothing needs proving); `npm test` runs it (about 2 s).
set -euo pipefail
source "$(dirname "$0")/env.sh"
if [ "$(id -u)" != 0 ]; then echo "private-clone check skipped: not root"; exit 0; fi

home=$(getent passwd root | cut -d: -f6)
clone=$(mktemp -d "$home/.cellwright-clone-check.XXXXXX")
cp -r "$ROOT/scripts" "$clone/"
# A test port nobody listens on, between the ranges the worktrees use (54339 + 100·n).
shift_free=$((SHIFT + 50))
while (exec 3<>"/dev/tcp/127.0.0.1/$((54339 + shift_free))") 2>/dev/null; do shift_free=$((shift_free + 1)); done
export CW_PORT_SHIFT=$shift_free
cluster=$(bash -c 'source "$0/scripts/env.sh"; cw_profile test; dirname "$PG_DATA"' "$clone")
cleanup() {
  bash "$clone/scripts/db.sh" stop test >/dev/null 2>&1 || true
  rm -rf "$cluster"; rmdir "$(dirname "$cluster")" 2>/dev/null || true
  rm -rf "$clone"
}
trap cleanup EXIT

bash "$clone/scripts/db.sh" start test >/dev/null
case "$cluster" in /var/lib/postgresql/cellwright/*) ;; *) echo "the cluster of a clone in $home is not under /var/lib/postgresql/cellwright: $cluster" >&2; exit 1 ;; esac
url=$(bash -c 'source "$0/scripts/env.sh"; cw_profile test; echo "$DATABASE_URL"' "$clone")
who=$(psql "$url" -Atc "select current_user || ' ' || (select rolsuper from pg_roles where rolname = current_user)")
[ "$who" = "cellwright_app false" ] || { echo "expected the app role, not a superuser; got: $who" >&2; exit 1; }
[ "$(stat -c %a "$clone")" = 700 ] || { echo "the clone's folder is no longer mode 700" >&2; exit 1; }
echo "private-clone check: a clone in a mode-700 folder of $home ran its own cluster in $cluster and signed in as $who"
