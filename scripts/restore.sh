#!/usr/bin/env bash
# `npm run restore -- <folder> [--profile demo|test] [--database NAME] [--replace]`: checks the folder's
# manifest, rebuilds the database from its dump, puts the stored objects back, then runs verify on it.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
profile=demo database=""
args=("$@")
for i in "${!args[@]}"; do
  case "${args[$i]}" in --profile) profile="${args[$((i + 1))]}" ;; --database) database="${args[$((i + 1))]}" ;; esac
done
bash scripts/db.sh start "$profile" >/dev/null
start_s3_fake "$profile" >/dev/null
cw_profile "$profile"
PG_BIN=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1)
export PG_BIN RESTORE_ADMIN_URL="${CW_SUPERUSER_URL:-postgres://postgres@127.0.0.1:$PG_PORT}/postgres"
npx tsx --import ./scripts/allow-server-only.mjs scripts/restore.ts "$@"
log "verifying the restored database"
export DATABASE_URL="${DATABASE_URL%/*}/${database:-$PG_DB}"
exec npx tsx --import ./scripts/allow-server-only.mjs scripts/verify.ts
