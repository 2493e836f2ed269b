#!/usr/bin/env bash
# `npm run demo`: dependencies, PostgreSQL, migrations, demo data, a production build, then the app
# on http://localhost:3000. Safe to run again: each step checks what is already there.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
PORT="${PORT:-$((3000 + SHIFT))}"

ensure_dependencies
bash scripts/db.sh start demo
start_s3_fake demo
start_mail_catcher demo
cw_profile demo
# Links in e-mails and on certificates point at this app.
export CELLWRIGHT_PUBLIC_URL="${CELLWRIGHT_PUBLIC_URL:-http://localhost:$PORT}"
# Migrations run as the owner role; the seed and the app as the app role (docs/deployment-database.md).
log "migrating"; DATABASE_URL="$OWNER_DATABASE_URL" npx tsx scripts/migrate.ts
log "seeding the demo lab"; npx tsx --import ./scripts/allow-server-only.mjs scripts/seed.ts

# A previous demo still running would hold the port (and its cycler would write on): stop each process group.
for what in app demo-cycler push-log-demo; do
  if [ -f ".data/$what.pid" ] && kill -0 "$(cat ".data/$what.pid")" 2>/dev/null; then
    log "stopping the previous demo's $what"
    kill -- -"$(cat ".data/$what.pid")" 2>/dev/null || true
    sleep 1
  fi
done

log "starting the log worker"; start_worker demo "$DATABASE_URL"

log "building the app"; npx next build >.data/next-build.log 2>&1 || { tail -40 .data/next-build.log; exit 1; }

log "starting the app"
setsid node scripts/serve.mjs -H 127.0.0.1 -p "$PORT" >.data/app.log 2>&1 &
echo $! >.data/app.pid
stop_demo() {
  for what in push-log-demo demo-cycler app; do [ -f ".data/$what.pid" ] && kill -- -"$(cat ".data/$what.pid")" 2>/dev/null; done
  stop_worker demo
}
trap 'stop_demo; exit 0' INT TERM
for _ in $(seq 1 60); do
  curl -fs "http://localhost:$PORT/api/health" >/dev/null 2>&1 && break
  sleep 0.5
done
curl -fs "http://localhost:$PORT/api/health" >/dev/null || { echo "the app did not start; see .data/app.log" >&2; tail -20 .data/app.log; exit 1; }

# The live endurance run: an invented cycler writes the next cycles into a folder every 45 s, and the push
# command sends each file to the run with the channel's token (docs/push-log.md). The token stays in a
# mode-600 file of the demo's state folder and is never printed.
CYCLER_DIR="$ROOT/.data/demo-cycler"
mkdir -p "$CYCLER_DIR/log" && chmod 700 "$CYCLER_DIR"
live=$(npx tsx --import ./scripts/allow-server-only.mjs scripts/demo-cycler-token.ts "$CYCLER_DIR/token")
LIVE_RUN="${live%% *}" LIVE_RUN_ID="${live##* }"
log "starting the invented demo cycler and the push command for run $LIVE_RUN"
setsid npx tsx scripts/demo-cycler.ts "$CYCLER_DIR/log" >.data/demo-cycler.log 2>&1 &
echo $! >.data/demo-cycler.pid
setsid npx tsx scripts/push-log.ts --watch "$CYCLER_DIR/log" --url "http://localhost:$PORT" --run "$LIVE_RUN" --token-file "$CYCLER_DIR/token" --settle 5 --interval 5 >.data/push-log-demo.log 2>&1 &
echo $! >.data/push-log-demo.pid

npx tsx scripts/print-accounts.ts "http://localhost:$PORT"
echo "Live endurance run: open run $LIVE_RUN (specimen HV30-ENG-02) at http://localhost:$PORT/runs/$LIVE_RUN_ID/results and its log parts at"
echo "  http://localhost:$PORT/runs/$LIVE_RUN_ID/log: an invented cycler writes the next 2 cycles every 45 s and the push command sends them"
echo "  (.data/demo-cycler.log, .data/push-log-demo.log). The push only sends files; it never controls a cycler."
echo "E-mail goes to the local mail catcher (inbox: $MAIL_CATCHER_URL/messages, or Administration → E-mail in the app)."
echo "Logs: .data/app.log and .data/worker-demo.log (the worker that reads uploaded data logs)."
echo "Press Ctrl-C to stop the app, the worker, the demo cycler and the push command (PostgreSQL, the S3 fake and the mail catcher keep running: npm run db:stop stops them)."
wait
