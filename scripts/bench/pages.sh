#!/usr/bin/env bash
# The page benchmark of `npm run bench` (scripts/bench/pages.ts says what it measures). Serves the current
# tree's production build and, unless CW_BENCH_BASELINE=skip, the baseline commit's build (made by
# baseline.sh under .data/bench/baseline) on two loopback ports moved by CW_PORT_SHIFT, both against one
# database of the bench cluster seeded with the demo lab, and measures them in turns.
#   CW_BENCH_BASELINE   commit to compare with (default 9952c40, main before the fast-pages work), or "skip"
#   CW_BENCH_NO_BUILD=1 serve the current .next as it is (after a build of your own)
#   BENCH_LOAD_SECONDS, BENCH_LOAD_TURNS, BENCH_ALONE_RUNS   shorten a quick run (defaults 20, 2, 10)
set -euo pipefail
source "$(dirname "$0")/../env.sh"
cd "$ROOT"
baseline="${CW_BENCH_BASELINE:-9952c40}"
now_port=$((3050 + SHIFT))
base_port=$((3051 + SHIFT))
mkdir -p .data/bench

bash scripts/db.sh start bench >/dev/null
start_s3_fake bench >/dev/null
start_mail_catcher bench >/dev/null
cw_profile bench
db=cellwright_bench_pages
export DATABASE_URL="${DATABASE_URL%/*}/$db" OWNER_DATABASE_URL="${OWNER_DATABASE_URL%/*}/$db"
psql "${ADMIN_DATABASE_URL%/*}/postgres" -qAt -c "select 1 from pg_database where datname = '$db'" | grep -q 1 ||
  psql "${ADMIN_DATABASE_URL%/*}/postgres" -qc "create database $db owner cellwright_owner"
DATABASE_URL="$OWNER_DATABASE_URL" npx tsx scripts/migrate.ts >/dev/null
npx tsx --import ./scripts/allow-server-only.mjs scripts/seed.ts >/dev/null
export CELLWRIGHT_PUBLIC_URL="http://localhost:$now_port"

if [ "${CW_BENCH_NO_BUILD:-}" != 1 ]; then
  log "pages: building the current tree"
  npx next build >.data/bench/next-build.log 2>&1 || { tail -40 .data/bench/next-build.log; exit 1; }
fi
base_dir=""
if [ "$baseline" != skip ]; then
  log "pages: the baseline build ($baseline)"
  base_dir=$(bash scripts/bench/baseline.sh "$baseline" | tail -1)
fi

pids=()
stop_servers() { for p in "${pids[@]}"; do kill -- -"$p" 2>/dev/null || true; done; }
trap stop_servers EXIT
serve() { # dir port log
  (cd "$1" && exec setsid node scripts/serve.mjs -H 127.0.0.1 -p "$2" >"$3" 2>&1) &
  pids+=($!)
  for _ in $(seq 1 120); do curl -fs "http://127.0.0.1:$2/api/health" >/dev/null 2>&1 && return 0; sleep 0.5; done
  echo "the app on port $2 did not start; see $3" >&2; tail -20 "$3" >&2; return 1
}
serve "$ROOT" "$now_port" "$ROOT/.data/bench/app-now.log"
[ -n "$base_dir" ] && serve "$base_dir" "$base_port" "$ROOT/.data/bench/app-baseline.log"

npx tsx --import ./scripts/allow-server-only.mjs scripts/bench/pages-setup.ts 20 >.data/bench/pages-targets.json
BENCH_NOW_URL="http://127.0.0.1:$now_port" BENCH_BASELINE_URL="${base_dir:+http://127.0.0.1:$base_port}" BENCH_CORES="$(nproc)" \
  npx tsx scripts/bench/pages.ts .data/bench/pages-targets.json
