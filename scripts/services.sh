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

# Runs a PostgreSQL tool as the cluster's owner: initdb refuses to run as root, so root hands
# the cluster to the postgres user; any other user owns and runs it directly.
# From /, since postgres may not be allowed into the folder npm start was called from.
pg_run() {
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# Where root keeps a checkout's cluster when the postgres user cannot enter the checkout.
PG_ELSEWHERE_BASE=/var/lib/sheathwise

# pg_elsewhere_dir: the folder for this checkout's cluster outside it, named after the
# checkout's real path (folder name plus a hash) so that two clones never share one.
pg_elsewhere_dir() {
  local real name hash
  real="$(cd "$ROOT" && pwd -P)"
  name="$(printf '%s' "${real##*/}" | tr -c 'A-Za-z0-9._-' '_' | cut -c1-40)"
  hash="$(printf '%s' "$real" | sha256sum | cut -c1-12)"
  echo "$PG_ELSEWHERE_BASE/$name-$hash"
}

# choose_pg_dir: sets PG_DIR to this checkout's cluster folder and says where it is. It is
# .data/pg, except as root when the postgres user cannot pass through the checkout's folders
# (a private parent such as /root or one made by mktemp -d): then only the cluster lives in
# pg_elsewhere_dir, and .data/pg-location names it. The user's folders keep their permissions.
choose_pg_dir() {
  ensure_postgres_binaries
  mkdir -p "$ROOT/.data"
  local elsewhere
  elsewhere="$(pg_elsewhere_dir)"
  if [ "$(id -u)" != 0 ]; then
    PG_DIR="$ROOT/.data/pg"
    log "database cluster: $PG_DIR (run as $(id -un))"
  elif [ ! -f "$elsewhere/pg/PG_VERSION" ] && runuser -u postgres -- test -x "$ROOT/.data"; then
    PG_DIR="$ROOT/.data/pg"
    rm -f "$ROOT/.data/pg-location"
    log "database cluster: $PG_DIR (run as postgres)"
  else
    # Our own folders: made traversable for postgres, the cluster itself private to it.
    install -d -m 755 "$PG_ELSEWHERE_BASE" "$elsewhere"
    install -d -o postgres -g postgres -m 700 "$elsewhere/pg"
    if ! runuser -u postgres -- test -w "$elsewhere/pg"; then
      log "the postgres user cannot write to $elsewhere/pg: check the permissions of $PG_ELSEWHERE_BASE"
      return 1
    fi
    printf '%s\n' "$ROOT" >"$elsewhere/checkout"
    printf '%s\n' "$elsewhere" >"$ROOT/.data/pg-location"
    PG_DIR="$elsewhere/pg"
    if runuser -u postgres -- test -x "$ROOT/.data"; then
      log "database cluster: $PG_DIR (run as postgres), made when the postgres user could not enter"
      log "this checkout, and kept for it (delete with: rm -rf $elsewhere)"
    else
      log "the postgres user cannot enter $ROOT (a parent folder is private), so the database"
      log "cluster of this checkout is kept in $PG_DIR (run as postgres; delete with: rm -rf $elsewhere)"
    fi
    if [ -f "$ROOT/.data/pg/PG_VERSION" ]; then
      log "an older cluster in $ROOT/.data/pg cannot be reached and is left as it is"
    fi
  fi
}

# pg_running DATA_DIR: whether the cluster in DATA_DIR is up.
pg_running() {
  [ -f "$1/PG_VERSION" ] && pg_run "$PG_BIN/pg_ctl" -D "$1" status >/dev/null 2>&1
}

# start_postgres DATA_DIR PORT DBNAME [PORT_VARIABLE]: creates the cluster on first use, starts
# it when stopped, reuses it when already running; sets DATABASE_URL.
start_postgres() {
  local data="$1" port="$2" dbname="$3" port_var="${4:-}"
  ensure_postgres_binaries
  mkdir -p "$data"
  if [ "$(id -u)" = 0 ]; then chown postgres: "$data"; chmod 700 "$data"; fi
  if [ ! -f "$data/PG_VERSION" ]; then
    log "creating PostgreSQL cluster in $data"
    pg_run "$PG_BIN/initdb" -D "$data" -U app --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if pg_running "$data"; then
    # The running cluster keeps the port it was started with (line 4 of postmaster.pid).
    port="$(sed -n 4p "$data/postmaster.pid")"
    log "PostgreSQL already running on 127.0.0.1:$port (reused)"
    PG_OWNED=0
  else
    if port_in_use "$port"; then
      log "port $port (PostgreSQL) is taken by another program: $(port_advice "$port" "$port_var")"
      return 1
    fi
    # The socket sits in the cluster folder; a Unix socket path is limited to 107 bytes, so a
    # deeply placed checkout goes without one (every client here connects over TCP).
    local socket_dir="$data"
    [ "${#data}" -le 80 ] || socket_dir="''"
    pg_run "$PG_BIN/pg_ctl" -D "$data" -l "$data/server.log" \
      -o "-c listen_addresses=127.0.0.1 -p $port -k $socket_dir" -w start >/dev/null
    log "PostgreSQL started on 127.0.0.1:$port"
    PG_OWNED=1
  fi
  PG_DATA="$data"
  "$PG_BIN/psql" -X -h 127.0.0.1 -p "$port" -U app -d postgres -tAc \
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
  # A catcher already on the port would answer the health check in our stead.
  require_free_ports "mail SMTP:$smtp:" "mail inbox:$web:" || return 1
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
  require_free_ports "S3 fake:$port:" || return 1
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

# exec_logged FILE COMMAND...: becomes COMMAND (so a kept PID is the command's), its output in
# FILE, or in ours when FILE is empty. Reopening /dev/stdout instead would empty a file that
# npm start's output is sent to, and with it the start-up log written so far.
exec_logged() {
  local file="$1"
  shift
  if [ -n "$file" ]; then exec "$@" >"$file" 2>&1; else exec "$@" 2>&1; fi
}

build_app() {
  log "building the app for port $SHEATHWISE_PORT"
  (cd "$ROOT" && exec_logged "${BUILD_LOG:-}" node_modules/.bin/astro build) || { log "build failed"; return 1; }
  # The compute worker threads' bundle (dist/workers), after astro build has emptied dist/.
  if [ -n "${BUILD_LOG:-}" ]; then
    (cd "$ROOT" && node scripts/build-workers.mjs >>"$BUILD_LOG" 2>&1)
  else
    (cd "$ROOT" && node scripts/build-workers.mjs)
  fi || { log "building the compute worker failed"; return 1; }
}

# migrate_and_seed [--seed]: applies drizzle/ migrations, then the demo scenario once.
migrate_and_seed() {
  (cd "$ROOT" && node_modules/.bin/tsx scripts/migrate.ts "$@")
}

# With SHEATHWISE_PROCESSES above 1, that many server processes (ports SHEATHWISE_PORT+1 …)
# behind the local reverse proxy on SHEATHWISE_PORT (scripts/cluster.mjs).
start_server() {
  local script="$ROOT/scripts/serve.mjs"
  [ "${SHEATHWISE_PROCESSES:-1}" -gt 1 ] && script="$ROOT/scripts/cluster.mjs"
  exec_logged "${SERVER_LOG:-}" env HOST=127.0.0.1 PORT="$SHEATHWISE_PORT" node "$script" &
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

# port_advice PORT [VARIABLE]: how to move a service off a taken port, with a free one nearby.
port_advice() {
  local port="$1" var="${2:-}" free
  for ((free = port + 1; free < port + 200 && free < 65536; free++)); do
    port_in_use "$free" || break
  done
  if [ -n "$var" ]; then
    echo "choose another with $var (e.g. $var=$free; port $free is free now)"
  else
    echo "choose another port (port $free is free now; see \"What runs where\" in README.md)"
  fi
}

# require_free_ports LABEL:PORT:VARIABLE ...: checks every port before anything starts, names
# each one that is taken or given twice, and the variable that moves it; fails if any is.
require_free_ports() {
  local spec label port var seen=" " status=0
  for spec in "$@"; do
    IFS=: read -r label port var <<<"$spec"
    if [[ ! "$port" =~ ^[0-9]+$ ]] || ((port < 1 || port > 65535)); then
      log "port \"$port\" ($label) is not a port number${var:+: set $var to a number from 1024 to 65535}"
      status=1
    elif [[ "$seen" == *" $port "* ]]; then
      log "port $port ($label) is given to two services${var:+: set $var to another port}"
      status=1
    elif port_in_use "$port"; then
      log "port $port ($label) is taken by another program: $(port_advice "$port" "$var")"
      status=1
    fi
    seen+="$port "
  done
  return "$status"
}
