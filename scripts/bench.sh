#!/usr/bin/env bash
# `npm run bench`: performance figures, reported, not asserted (timed tests are flaky on shared machines).
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
ensure_dependencies
log "sign-in cost"; npx tsx scripts/bench/auth.ts
