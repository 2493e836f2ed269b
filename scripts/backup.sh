#!/usr/bin/env bash
# `npm run backup [-- --profile demo|test] [--database NAME] [--out FOLDER]`: dump + stored objects +
# SHA256SUMS into .data/backups/<time>/ by default. Connects as the cluster's superuser on loopback
# (CW_SUPERUSER_URL overrides it), starting the profile's PostgreSQL and S3 stand-in if needed.
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
export PG_BIN BACKUP_ROOT="$ROOT/.data/backups"
export BACKUP_DATABASE_URL="${CW_SUPERUSER_URL:-postgres://postgres@127.0.0.1:$PG_PORT}/${database:-$PG_DB}"
exec npx tsx --import ./scripts/allow-server-only.mjs scripts/backup.ts "$@"
