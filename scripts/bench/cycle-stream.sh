#!/usr/bin/env bash
# The streaming per-cycle benchmark of `npm run bench` (scripts/bench/cycle-stream.ts says what it measures):
# an invented endurance log of 10⁶ and of 10⁷ samples, written in parts, read part after part through the
# app's ingest path into a database of the bench cluster seeded with the demo lab, each case in a process
# of its own so its peak RSS is its own.
#   BENCH_CYCLE_CASES    sample counts to run (default "1000000 10000000")
#   BENCH_PART_SAMPLES   samples per part (default 500 000)
set -euo pipefail
source "$(dirname "$0")/../env.sh"
cd "$ROOT"
bash scripts/db.sh start bench >/dev/null
start_s3_fake bench >/dev/null
start_mail_catcher bench >/dev/null
cw_profile bench
db=cellwright_bench_cycles
# A fresh database each time: 10⁷ samples are ≈ 330 MB of chunks.
psql "${ADMIN_DATABASE_URL%/*}/postgres" -qc "drop database if exists $db with (force)" -c "create database $db owner cellwright_owner"
export DATABASE_URL="${DATABASE_URL%/*}/$db" OWNER_DATABASE_URL="${OWNER_DATABASE_URL%/*}/$db"
DATABASE_URL="$OWNER_DATABASE_URL" npx tsx scripts/migrate.ts >/dev/null
npx tsx --import ./scripts/allow-server-only.mjs scripts/seed.ts >/dev/null
for n in ${BENCH_CYCLE_CASES:-1000000 10000000}; do
  npx tsx --import ./scripts/allow-server-only.mjs scripts/bench/cycle-stream.ts --make "$n"
  # A fresh process per case, and a fresh run's log each time (the first part starts the cycles afresh).
  node --import tsx --import ./scripts/allow-server-only.mjs scripts/bench/cycle-stream.ts --case "$n"
done
