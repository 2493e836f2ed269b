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

# A previous demo still running would hold the port: stop its whole process group.
if [ -f .data/app.pid ] && kill -0 "$(cat .data/app.pid)" 2>/dev/null; then
  log "stopping the previous demo app"
  kill -- -"$(cat .data/app.pid)" 2>/dev/null || true
  sleep 1
fi

log "starting the log worker"; start_worker demo "$DATABASE_URL"

log "building the app"; npx next build >.data/next-build.log 2>&1 || { tail -40 .data/next-build.log; exit 1; }

log "starting the app"
setsid node scripts/serve.mjs -H 127.0.0.1 -p "$PORT" >.data/app.log 2>&1 &
echo $! >.data/app.pid
trap 'kill -- -"$(cat .data/app.pid)" 2>/dev/null; stop_worker demo; exit 0' INT TERM
for _ in $(seq 1 60); do
  curl -fs "http://localhost:$PORT/api/health" >/dev/null 2>&1 && break
  sleep 0.5
done
curl -fs "http://localhost:$PORT/api/health" >/dev/null || { echo "the app did not start; see .data/app.log" >&2; tail -20 .data/app.log; exit 1; }

npx tsx scripts/print-accounts.ts "http://localhost:$PORT"
echo "E-mail goes to the local mail catcher (inbox: $MAIL_CATCHER_URL/messages, or Administration → E-mail in the app)."
echo "Logs: .data/app.log and .data/worker-demo.log (the worker that reads uploaded data logs)."
echo "Press Ctrl-C to stop the app and the worker (PostgreSQL, the S3 fake and the mail catcher keep running: npm run db:stop stops them)."
wait
