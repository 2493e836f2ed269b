#!/usr/bin/env bash
# `npm run verify [demo|test] [database]`: the audit chain and every stored file against its hash.
# Uses the demo database by default; starts its PostgreSQL and S3 stand-in if they are not running.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
profile="${1:-demo}"
bash scripts/db.sh start "$profile" >/dev/null
start_s3_fake "$profile" >/dev/null
cw_profile "$profile"
if [ -n "${2:-}" ]; then export DATABASE_URL="${DATABASE_URL%/*}/$2"; fi
exec npx tsx --import ./scripts/allow-server-only.mjs scripts/verify.ts
