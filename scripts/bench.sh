#!/usr/bin/env bash
# `npm run bench`: performance figures, reported, not asserted (timed tests are flaky on shared machines).
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
ensure_dependencies
log "sign-in cost"; npx tsx scripts/bench/auth.ts

# The log benchmark gets its own cluster so it never touches demo or test data.
bash scripts/db.sh start bench
cw_profile bench
# The log benchmark compares storage layouts in scratch tables of its own, so it signs in as the owner role.
export DATABASE_URL="$OWNER_DATABASE_URL"
log "2-million-row log: ingest, store, evaluate, read back"
npx tsx scripts/bench/log-ingest.ts --make
node --import tsx scripts/bench/log-ingest.ts
log "streaming per-cycle evaluation: 10⁶ and 10⁷ samples in parts"; bash scripts/bench/cycle-stream.sh
# Two fresh processes: one as before any preloading, one after what instrumentation.ts does at server start.
log "certificate: render and sign, in a process that did not preload"; NODE_ENV=production npx tsx scripts/bench/certificate.ts
log "certificate: render and sign, after the start-up preload"; NODE_ENV=production npx tsx scripts/bench/certificate.ts --preloaded

# Pages under load: the current build beside the baseline build (CW_BENCH_BASELINE=skip for a quick run).
log "pages: 20 signed-in clients, and single pages in Chromium"; bash scripts/bench/pages.sh
