#!/usr/bin/env bash
# Builds the baseline commit of the page benchmark (default 9952c40, main before the fast-pages work) in a
# git worktree under .data/bench/baseline, so `npm run bench` can serve today's and the new build side by
# side against one database. Reuses the worktree, its node_modules and its build while the commit is unchanged.
# Usage: baseline.sh <commit>   (prints the worktree's path on the last line)
set -euo pipefail
source "$(dirname "$0")/../env.sh"
cd "$ROOT"
commit=$(git rev-parse --verify "${1:?baseline commit}^{commit}")
dir="$ROOT/.data/bench/baseline"
stamp="$dir/.data/bench-built-from"
if [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$commit" ] && [ -f "$dir/.next/BUILD_ID" ]; then
  echo "$dir"; exit 0
fi
mkdir -p "$ROOT/.data/bench"
if [ -d "$dir" ]; then
  git -C "$dir" checkout --quiet --detach "$commit" >&2
else
  git worktree prune
  git worktree add --quiet --detach "$dir" "$commit" >&2
fi
log "baseline $commit: npm ci (from the cache)" >&2
(cd "$dir" && npm ci --no-audit --no-fund --prefer-offline >&2)
log "baseline $commit: next build" >&2
mkdir -p "$dir/.data"
(cd "$dir" && npx next build >"$dir/.data/next-build.log" 2>&1) || { tail -40 "$dir/.data/next-build.log" >&2; exit 1; }
echo "$commit" >"$stamp"
echo "$dir"
