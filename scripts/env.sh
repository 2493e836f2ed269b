# Shared settings for the project's scripts. Source it; it sets nothing outside this shell.
# Two clusters so `npm test` never touches demo data: "demo" on 54329, "test" on 54339.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export NEXT_TELEMETRY_DISABLED=1
# CW_PORT_SHIFT moves every local port (databases, fakes, browser-test app) by the same amount, so two
# clones on one machine can run their tests side by side. Default 0: the ports in DEVELOPERS.md.
SHIFT="${CW_PORT_SHIFT:-0}"
export E2E_PORT="${E2E_PORT:-$((3100 + SHIFT))}"

cw_profile() {
  local data sock
  case "${1:-demo}" in
    demo) PG_PORT=$((54329 + SHIFT)); data=pg; sock=pgsock; PG_DB=cellwright ;;
    test) PG_PORT=$((54339 + SHIFT)); data=pg-test; sock=pgsock-test; PG_DB=cellwright_test ;;
    bench) PG_PORT=$((54349 + SHIFT)); data=pg-bench; sock=pgsock-bench; PG_DB=cellwright_bench ;;
    *) echo "unknown profile: $1 (demo|test|bench)" >&2; return 2 ;;
  esac
  # As root the server runs as Debian's postgres user, who may not be able to reach the clone (a clone in
  # /root, mode 700): the cluster and its socket then live in a folder that user owns, one per clone path.
  # A cluster made earlier under .data/ stays where it is.
  if [ "$(id -u)" = 0 ] && [ ! -f "$ROOT/.data/$data/PG_VERSION" ]; then
    local home; home="/var/lib/postgresql/cellwright/$(printf %s "$ROOT" | sha256sum | cut -c1-16)/${1:-demo}"
    PG_DATA="$home/data"; PG_SOCK="$home/sock"
  else
    PG_DATA="$ROOT/.data/$data"; PG_SOCK="$ROOT/.data/$sock"
  fi
  export PG_PORT PG_DATA PG_SOCK PG_DB
  cw_db_roles
  # The app signs in as cellwright_app (no superuser, owns nothing); migrations as cellwright_owner;
  # scripts that create databases or roles as postgres. docs/deployment-database.md says who may do what.
  export DATABASE_URL="postgres://cellwright_app:$(cw_urlencode "$DB_APP_PASSWORD")@127.0.0.1:$PG_PORT/$PG_DB"
  export OWNER_DATABASE_URL="postgres://cellwright_owner:$(cw_urlencode "$DB_OWNER_PASSWORD")@127.0.0.1:$PG_PORT/$PG_DB"
  export ADMIN_DATABASE_URL="postgres://postgres:$(cw_urlencode "$DB_SUPERUSER_PASSWORD")@127.0.0.1:$PG_PORT/$PG_DB"
  cw_app_keys
}

# Keys every app server of one installation must share (docs/deployment.md): the key that seals the lab's
# signing key in the database, and the one Next.js encrypts server actions' bound values with, so a form
# rendered by one server may be posted to another. Configured values win; otherwise 32 random bytes in
# base64, generated once into .data/secrets (mode 600) like the database passwords.
cw_app_keys() {
  (umask 077; mkdir -p "$ROOT/.data/secrets")
  CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY=$(cw_key signing-key-encryption "${CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY:-}")
  NEXT_SERVER_ACTIONS_ENCRYPTION_KEY=$(cw_key server-actions-encryption "${NEXT_SERVER_ACTIONS_ENCRYPTION_KEY:-}")
  export CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY NEXT_SERVER_ACTIONS_ENCRYPTION_KEY
}

cw_key() {
  if [ -n "$2" ]; then printf %s "$2"; return; fi
  local file="$ROOT/.data/secrets/$1.key"
  [ -s "$file" ] || (umask 077; head -c 32 /dev/urandom | base64 | tr -d '\n' >"$file")
  cat "$file"
}

# The three database roles' passwords: configured secrets (CELLWRIGHT_DB_SUPERUSER_PASSWORD,
# CELLWRIGHT_DB_OWNER_PASSWORD, CELLWRIGHT_DB_APP_PASSWORD) or generated once into .data/secrets (mode 600).
# PGPASSFILE lets psql and pg_dump sign in as any of them without a password on the command line.
cw_db_roles() {
  local dir="$ROOT/.data/secrets"
  (umask 077; mkdir -p "$dir")
  DB_SUPERUSER_PASSWORD=$(cw_secret postgres "${CELLWRIGHT_DB_SUPERUSER_PASSWORD:-}")
  DB_OWNER_PASSWORD=$(cw_secret owner "${CELLWRIGHT_DB_OWNER_PASSWORD:-}")
  DB_APP_PASSWORD=$(cw_secret app "${CELLWRIGHT_DB_APP_PASSWORD:-}")
  (umask 077; {
    printf '127.0.0.1:*:*:postgres:%s\n' "$(cw_pgpass_escape "$DB_SUPERUSER_PASSWORD")"
    printf '127.0.0.1:*:*:cellwright_owner:%s\n' "$(cw_pgpass_escape "$DB_OWNER_PASSWORD")"
    printf '127.0.0.1:*:*:cellwright_app:%s\n' "$(cw_pgpass_escape "$DB_APP_PASSWORD")"
  } >"$dir/pgpass")
  export PGPASSFILE="$dir/pgpass"
}

cw_secret() {
  if [ -n "$2" ]; then printf %s "$2"; return; fi
  local file="$ROOT/.data/secrets/$1.password"
  [ -s "$file" ] || (umask 077; head -c 24 /dev/urandom | od -An -tx1 | tr -d ' \n' >"$file")
  cat "$file"
}

cw_urlencode() {
  local LC_ALL=C s="$1" out="" c i
  for ((i = 0; i < ${#s}; i++)); do
    c="${s:i:1}"
    case "$c" in [a-zA-Z0-9._~-]) out+="$c" ;; *) printf -v c '%%%02X' "'$c"; out+="$c" ;; esac
  done
  printf %s "$out"
}

cw_pgpass_escape() { local s="${1//\\/\\\\}"; printf %s "${s//:/\\:}"; }

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

# The local S3-compatible store: one per profile, started in the background, pid under .data/.
s3_profile() {
  case "${1:-demo}" in
    demo) S3_PORT=$((54340 + SHIFT)); S3_DIR="$ROOT/.data/s3" ;;
    test) S3_PORT=$((54341 + SHIFT)); S3_DIR="$ROOT/.data/s3-test" ;;
    bench) S3_PORT=$((54346 + SHIFT)); S3_DIR="$ROOT/.data/s3-bench" ;;
  esac
  export S3_ENDPOINT="http://127.0.0.1:$S3_PORT" S3_BUCKET=cellwright S3_REGION=us-east-1
  export S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
  S3_PID_FILE="$ROOT/.data/s3-${1:-demo}.pid"
}

start_s3_fake() {
  s3_profile "$1"
  mkdir -p "$S3_DIR"
  if [ -f "$S3_PID_FILE" ] && kill -0 "$(cat "$S3_PID_FILE")" 2>/dev/null; then
    echo "S3 fake already running on 127.0.0.1:$S3_PORT"; return 0
  fi
  setsid node "$ROOT/scripts/s3-fake.mjs" "$S3_PORT" "$S3_DIR" >"$ROOT/.data/s3-$1.log" 2>&1 &
  echo $! >"$S3_PID_FILE"
  for _ in $(seq 1 50); do
    (exec 3<>"/dev/tcp/127.0.0.1/$S3_PORT") 2>/dev/null && { echo "S3 fake started on 127.0.0.1:$S3_PORT"; return 0; }
    sleep 0.1
  done
  echo "the S3 fake did not start; see .data/s3-$1.log" >&2; cat "$ROOT/.data/s3-$1.log" >&2; return 1
}

# The local mail catcher (scripts/mail-catcher.mjs): a stand-in for the lab's SMTP server, one per
# profile, keeping every message it receives under .data/ and listing them over HTTP for the tests
# and the admin's e-mail page. A real lab sets SMTP_HOST (and SMTP_PORT, MAIL_FROM) to its own server.
mail_profile() {
  case "${1:-demo}" in
    demo) MAIL_SMTP_PORT=$((54342 + SHIFT)); MAIL_HTTP_PORT=$((54344 + SHIFT)) ;;
    test) MAIL_SMTP_PORT=$((54343 + SHIFT)); MAIL_HTTP_PORT=$((54345 + SHIFT)) ;;
    bench) MAIL_SMTP_PORT=$((54347 + SHIFT)); MAIL_HTTP_PORT=$((54348 + SHIFT)) ;;
    *) echo "unknown mail profile: $1 (demo|test|bench)" >&2; return 2 ;;
  esac
  MAIL_DIR="$ROOT/.data/mail-${1:-demo}"
  MAIL_PID_FILE="$ROOT/.data/mail-${1:-demo}.pid"
  export SMTP_HOST=127.0.0.1 SMTP_PORT="$MAIL_SMTP_PORT" MAIL_FROM="Cellwright <cellwright@lab.localhost>"
  export MAIL_CATCHER_URL="http://127.0.0.1:$MAIL_HTTP_PORT"
}

start_mail_catcher() {
  mail_profile "$1" || return
  mkdir -p "$MAIL_DIR"
  if [ -f "$MAIL_PID_FILE" ] && kill -0 "$(cat "$MAIL_PID_FILE")" 2>/dev/null; then
    echo "mail catcher already running on 127.0.0.1:$MAIL_SMTP_PORT"; return 0
  fi
  setsid node "$ROOT/scripts/mail-catcher.mjs" "$MAIL_SMTP_PORT" "$MAIL_HTTP_PORT" "$MAIL_DIR" >"$ROOT/.data/mail-$1.log" 2>&1 &
  echo $! >"$MAIL_PID_FILE"
  for _ in $(seq 1 50); do
    (exec 3<>"/dev/tcp/127.0.0.1/$MAIL_HTTP_PORT") 2>/dev/null && { echo "mail catcher started: SMTP 127.0.0.1:$MAIL_SMTP_PORT, inbox $MAIL_CATCHER_URL/messages"; return 0; }
    sleep 0.1
  done
  echo "the mail catcher did not start; see .data/mail-$1.log" >&2; cat "$ROOT/.data/mail-$1.log" >&2; return 1
}

# The log worker (scripts/worker.ts, `npm run worker`): reads uploaded data logs for one database.
# One per name (demo, e2e), started in the background with its own process group, pid under .data/.
# Takes the database URL it serves; the S3_* settings come from start_s3_fake, so start that first.
start_worker() {
  local name="$1" url="$2" pid_file="$ROOT/.data/worker-$1.pid"
  mkdir -p "$ROOT/.data"
  if [ -f "$pid_file" ] && kill -0 "$(cat "$pid_file")" 2>/dev/null; then
    echo "log worker ($name) already running"; return 0
  fi
  (cd "$ROOT" && DATABASE_URL="$url" LOG_INGEST_POLL_MS="${LOG_INGEST_POLL_MS:-1000}" setsid npx tsx --import ./scripts/allow-server-only.mjs scripts/worker.ts >"$ROOT/.data/worker-$name.log" 2>&1 &
    echo $! >"$pid_file")
  for _ in $(seq 1 100); do
    grep -q "reading data logs" "$ROOT/.data/worker-$name.log" 2>/dev/null && { echo "log worker ($name) started"; return 0; }
    kill -0 "$(cat "$pid_file")" 2>/dev/null || break
    sleep 0.2
  done
  echo "the log worker did not start; see .data/worker-$name.log" >&2; cat "$ROOT/.data/worker-$name.log" >&2; return 1
}

stop_worker() {
  local pid_file="$ROOT/.data/worker-$1.pid"
  [ -f "$pid_file" ] || return 0
  local pid; pid="$(cat "$pid_file")"
  if kill -0 "$pid" 2>/dev/null; then
    # SIGTERM: the worker finishes the job in hand (or leaves it to its lease) and exits.
    kill -TERM -- -"$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.2; done
    kill -KILL -- -"$pid" 2>/dev/null || true
    echo "log worker ($1) stopped"
  fi
  rm -f "$pid_file"
}
