#!/usr/bin/env bash
# `npm run verify [-- demo|test] [--profile demo|test] [--database NAME]`: the audit chain and every stored
# file against its hash. Uses the demo database by default; starts its PostgreSQL and S3 stand-in if needed.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
profile=demo database=""
args=("$@")
for i in "${!args[@]}"; do
  case "${args[$i]}" in
    --profile) profile="${args[$((i + 1))]}" ;;
    --database) database="${args[$((i + 1))]}" ;;
    demo | test) [ "$i" = 0 ] && profile="${args[$i]}" ;;
  esac
done
bash scripts/db.sh start "$profile" >/dev/null
start_s3_fake "$profile" >/dev/null
cw_profile "$profile"
if [ -n "$database" ]; then export DATABASE_URL="${DATABASE_URL%/*}/$database"; fi
exec npx tsx --import ./scripts/allow-server-only.mjs scripts/verify.ts
