#!/usr/bin/env bash
# Shared service orchestration for start.sh and test.sh: dependencies, a private PostgreSQL
# cluster on loopback, the maildev catcher, and the built server. Sourced, not run.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
STARTED_PIDS=()

log() { printf '\033[1;33m[sheathwise]\033[0m %s\n' "$*"; }

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

apt_install() {
  log "installing Debian packages: $*"
  as_root apt-get update -qq >/dev/null
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq "$@" >/dev/null
}

ensure_node_modules() {
  # Reinstall when the lock file changed since the last install.
  if [ ! -f "$ROOT/node_modules/.package-lock.json" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm dependencies (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

pg_bin_dir() {
  local dir
  for dir in /usr/lib/postgresql/*/bin; do
    [ -x "$dir/initdb" ] && { echo "$dir"; return 0; }
  done
  return 1
}

ensure_postgres_binaries() {
  if ! pg_bin_dir >/dev/null; then apt_install postgresql; fi
  PG_BIN="$(pg_bin_dir)"
}

# The record's plot is rendered to PNG with a machine font (DejaVu Sans).
ensure_fonts() {
  [ -f /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf ] || apt_install fonts-dejavu-core
}

ensure_chromium() {
  [ -x /usr/bin/chromium ] || apt_install chromium
}

# Runs a PostgreSQL tool as the cluster's owner: initdb refuses to run as root.
pg_run() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

# start_postgres DATA_DIR PORT DBNAME: creates the cluster on first use, starts it when
# stopped, reuses it when already running; sets DATABASE_URL.
start_postgres() {
  local data="$1" port="$2" dbname="$3"
  ensure_postgres_binaries
  mkdir -p "$data"
  if [ "$(id -u)" = 0 ]; then chown postgres: "$data"; chmod 700 "$data"; fi
  if [ ! -f "$data/PG_VERSION" ]; then
    log "creating PostgreSQL cluster in $data"
    pg_run "$PG_BIN/initdb" -D "$data" -U app --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if pg_run "$PG_BIN/pg_ctl" -D "$data" status >/dev/null 2>&1; then
    log "PostgreSQL already running on 127.0.0.1:$port (reused)"
    PG_OWNED=0
  else
    if port_in_use "$port"; then
      log "port $port is taken by another program: choose another with the PG port variable in README.md"
      return 1
    fi
    pg_run "$PG_BIN/pg_ctl" -D "$data" -l "$data/server.log" \
      -o "-c listen_addresses=127.0.0.1 -p $port -k $data" -w start >/dev/null
    log "PostgreSQL started on 127.0.0.1:$port"
    PG_OWNED=1
  fi
  PG_DATA="$data"
  "$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U app -d postgres -tAc \
    "select 1 from pg_database where datname = '$dbname'" | grep -q 1 ||
    "$PG_BIN/createdb" -h 127.0.0.1 -p "$port" -U app "$dbname"
  export DATABASE_URL="postgres://app@127.0.0.1:$port/$dbname"
}

stop_postgres() {
  if [ "${PG_OWNED:-0}" = 1 ] && [ -n "${PG_DATA:-}" ]; then
    pg_run "$PG_BIN/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null 2>&1 && log "PostgreSQL stopped"
    PG_OWNED=0
  fi
}

# start_maildev SMTP_PORT WEB_PORT: the local mail catcher, loopback only.
start_maildev() {
  local smtp="$1" web="$2"
  "$ROOT/node_modules/.bin/maildev" --ip 127.0.0.1 --web-ip 127.0.0.1 -s "$smtp" -w "$web" --silent >"${MAILDEV_LOG:-/dev/null}" 2>&1 &
  MAILDEV_PID=$!
  STARTED_PIDS+=("$MAILDEV_PID")
  wait_for_url "http://127.0.0.1:$web/api/healthz" 30 || { log "maildev did not start"; return 1; }
  export SMTP_HOST=127.0.0.1 SMTP_PORT="$smtp" MAILDEV_WEB_PORT="$web"
  log "mail catcher: SMTP 127.0.0.1:$smtp, inbox http://127.0.0.1:$web"
}

# start_s3 PORT DIRECTORY: the S3-compatible fake (s3rver) for uploaded files, loopback only.
start_s3() {
  local port="$1" dir="$2"
  mkdir -p "$dir"
  node "$ROOT/scripts/s3-fake.mjs" "$port" "$dir" sheathwise-files >"${S3_LOG:-/dev/null}" 2>&1 &
  STARTED_PIDS+=("$!")
  local i
  for ((i = 0; i < 100; i++)); do port_in_use "$port" && break; sleep 0.1; done
  port_in_use "$port" || { log "the S3 fake did not start"; return 1; }
  export S3_ENDPOINT="http://127.0.0.1:$port" S3_BUCKET=sheathwise-files S3_ACCESS_KEY=S3RVER S3_SECRET_KEY=S3RVER
  log "object store (S3 fake): http://127.0.0.1:$port, files in $dir"
}

wait_for_url() {
  local url="$1" seconds="$2" i
  for ((i = 0; i < seconds * 5; i++)); do
    curl -fsS -o /dev/null "$url" 2>/dev/null && return 0
    sleep 0.2
  done
  return 1
}

build_app() {
  log "building the app for port $SHEATHWISE_PORT"
  (cd "$ROOT" && node_modules/.bin/astro build >"${BUILD_LOG:-/dev/stdout}" 2>&1) || { log "build failed"; return 1; }
}

# migrate_and_seed [--seed]: applies drizzle/ migrations, then the demo scenario once.
migrate_and_seed() {
  (cd "$ROOT" && node_modules/.bin/tsx scripts/migrate.ts "$@")
}

start_server() {
  HOST=127.0.0.1 PORT="$SHEATHWISE_PORT" node "$ROOT/dist/server/entry.mjs" >"${SERVER_LOG:-/dev/stdout}" 2>&1 &
  SERVER_PID=$!
  STARTED_PIDS+=("$SERVER_PID")
  wait_for_url "http://127.0.0.1:$SHEATHWISE_PORT/signin" 60 || { log "server did not answer"; return 1; }
}

# Runs from EXIT traps, where errexit still applies: nothing here may fail the shell early.
stop_started() {
  local pid
  for pid in "${STARTED_PIDS[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${STARTED_PIDS[@]}"; do wait "$pid" 2>/dev/null || true; done
  STARTED_PIDS=()
  stop_postgres || true
}

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}
