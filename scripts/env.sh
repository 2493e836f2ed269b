# Shared settings for the project's scripts. Source it; it sets nothing outside this shell.
# Two clusters so `npm test` never touches demo data: "demo" on 54329, "test" on 54339.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export NEXT_TELEMETRY_DISABLED=1

cw_profile() {
  case "${1:-demo}" in
    demo) PG_PORT=54329; PG_DATA="$ROOT/.data/pg"; PG_SOCK="$ROOT/.data/pgsock"; PG_DB=cellwright ;;
    test) PG_PORT=54339; PG_DATA="$ROOT/.data/pg-test"; PG_SOCK="$ROOT/.data/pgsock-test"; PG_DB=cellwright_test ;;
    *) echo "unknown profile: $1 (demo|test)" >&2; return 2 ;;
  esac
  export PG_PORT PG_DATA PG_SOCK PG_DB
  export DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/$PG_DB"
}

log() { printf '\033[1m» %s\033[0m\n' "$*"; }

ensure_dependencies() {
  # npm ci only when the installed tree is missing or older than the lock file.
  if [ ! -f "$ROOT/node_modules/.package-lock.json" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm dependencies (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund)
  fi
}

APT_UPDATED=0
apt_install() {
  if [ "$(id -u)" != 0 ]; then
    echo "missing Debian packages: $* — install them (apt-get install $*) or run as root" >&2
    return 1
  fi
  if [ "$APT_UPDATED" = 0 ]; then apt-get update -qq; APT_UPDATED=1; fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "$@"
}
