#!/usr/bin/env bash
# `npm test`: installs what is missing, starts the test database (its own cluster and port), the
# local S3 fake and the local mail catcher, then
# typecheck, lint, unit + reference, integration and browser tests. Never touches demo data.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
started=$(date +%s)

ensure_dependencies
if [ ! -x /usr/bin/chromium ]; then log "installing Debian's chromium for browser tests"; apt_install chromium; fi
# pdfsig checks the certificates' PDF signatures independently of the code that made them.
if ! command -v pdfsig >/dev/null; then log "installing Debian's poppler-utils (pdfsig)"; apt_install poppler-utils; fi

bash scripts/db.sh start test
# The same scripts from a clone the postgres user cannot enter (root's home): a quick start, sign-in, stop.
bash scripts/check-private-clone.sh
start_s3_fake test
start_mail_catcher test
# Leave nothing running behind: the test cluster, the S3 fake and the mail catcher stop when the tests end.
trap 'bash "$ROOT/scripts/db.sh" stop test >/dev/null 2>&1 || true' EXIT
# Each run starts with an empty catcher inbox.
curl -fsS -X DELETE "$MAIL_CATCHER_URL/messages" >/dev/null
cw_profile test
export CELLWRIGHT_PUBLIC_URL="http://localhost:${E2E_PORT:-3100}"
# Integration tests: the superuser makes each file's database, the owner role migrates, the code under
# test connects as the app role. The browser tests' app connects as the app role too.
export TEST_DATABASE_URL="$ADMIN_DATABASE_URL" TEST_OWNER_DATABASE_URL="$OWNER_DATABASE_URL" TEST_APP_DATABASE_URL="$DATABASE_URL"
export E2E_DATABASE_URL="${DATABASE_URL%/*}/cellwright_e2e" E2E_OWNER_DATABASE_URL="${OWNER_DATABASE_URL%/*}/cellwright_e2e"
unset DATABASE_URL OWNER_DATABASE_URL
# Playwright empties test-results/ when it starts, so reports go to their own folder.
rm -rf test-reports; mkdir -p test-reports

# CW_TEST_STAGES picks stages while working on one part (e.g. "integration e2e"); CI runs them all.
stages=" ${CW_TEST_STAGES:-static unit integration e2e} "
stage() { [[ "$stages" == *" $1 "* ]]; }

if stage static; then
  log "typecheck"; npx next typegen >/dev/null; npx tsc --noEmit
  log "lint"; npx eslint --max-warnings 0 .
fi

if stage unit; then
  log "unit and reference tests"
  npx vitest run --project unit --project reference --reporter=default --reporter=json --outputFile.json=test-reports/vitest-unit.json
fi

if stage integration; then
  log "integration tests (PostgreSQL on 127.0.0.1:$PG_PORT)"
  npx vitest run --project integration --reporter=default --reporter=json --outputFile.json=test-reports/vitest-integration.json
fi

stage e2e || { echo "stages run: $stages"; exit 0; }
log "browser tests: fresh e2e database, production build, Chromium"
psql "${ADMIN_DATABASE_URL%/*}/postgres" -qc "drop database if exists cellwright_e2e with (force)" -c "create database cellwright_e2e owner cellwright_owner"
DATABASE_URL="$E2E_OWNER_DATABASE_URL" npx tsx scripts/migrate.ts >/dev/null
DATABASE_URL="$E2E_DATABASE_URL" npx tsx --import ./scripts/allow-server-only.mjs scripts/seed.ts >/dev/null
npx next build >test-reports/next-build.log 2>&1 || { tail -50 test-reports/next-build.log; exit 1; }
# Uploaded logs are read by the worker, as in production; it stops with the test cluster (db.sh stop test).
trap 'stop_worker e2e >/dev/null 2>&1 || true; bash "$ROOT/scripts/db.sh" stop test >/dev/null 2>&1 || true' EXIT
start_worker e2e "$E2E_DATABASE_URL"
# CW_E2E_SPECS names spec files to run alone (e.g. "tests/e2e/home-queues.spec.ts"); CI runs them all.
PLAYWRIGHT_JSON_OUTPUT_NAME=test-reports/playwright.json npx playwright test --reporter=list,json ${CW_E2E_SPECS:-}

node scripts/test-summary.mjs test-reports/vitest-unit.json test-reports/vitest-integration.json test-reports/playwright.json
echo "npm test took $(( $(date +%s) - started )) s"
