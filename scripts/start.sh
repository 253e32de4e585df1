#!/usr/bin/env bash
# npm start: the app with demo data on 127.0.0.1. Ctrl-C stops everything it started; the
# database (in .data/pg, or where choose_pg_dir says) keeps its data for the next start.
set -euo pipefail
source "$(dirname "$0")/services.sh"

export SHEATHWISE_PORT="${SHEATHWISE_PORT:-4321}"
PG_PORT="${SHEATHWISE_PG_PORT:-55432}"
SMTP_PORT_DEV="${SHEATHWISE_SMTP_PORT:-1025}"
MAIL_WEB_PORT="${SHEATHWISE_MAIL_WEB_PORT:-1080}"
S3_PORT="${SHEATHWISE_S3_PORT:-4569}"

trap 'stop_started; exit 0' INT TERM
trap 'stop_started' EXIT

choose_pg_dir
# Every port is checked before anything starts, so that a second clone's start stops at once
# and names each taken port. This checkout's own cluster, already up, is reused instead.
PORTS=("app:$SHEATHWISE_PORT:SHEATHWISE_PORT" "mail SMTP:$SMTP_PORT_DEV:SHEATHWISE_SMTP_PORT"
  "mail inbox:$MAIL_WEB_PORT:SHEATHWISE_MAIL_WEB_PORT" "S3 fake:$S3_PORT:SHEATHWISE_S3_PORT")
pg_running "$PG_DIR" || PORTS+=("PostgreSQL:$PG_PORT:SHEATHWISE_PG_PORT")
# SHEATHWISE_PROCESSES=N: N server processes on the ports after SHEATHWISE_PORT, behind a proxy on it.
PROCESSES="${SHEATHWISE_PROCESSES:-1}"
if [[ ! "$PROCESSES" =~ ^[0-9]+$ ]] || ((PROCESSES < 1 || PROCESSES > 32)); then
  log "SHEATHWISE_PROCESSES must be a whole number from 1 to 32, not \"$PROCESSES\""
  exit 1
fi
for ((i = 1; PROCESSES > 1 && i <= PROCESSES; i++)); do PORTS+=("server process $i:$((SHEATHWISE_PORT + i)):SHEATHWISE_PORT"); done
require_free_ports "${PORTS[@]}" || exit 1

ensure_node_modules
ensure_fonts
start_postgres "$PG_DIR" "$PG_PORT" sheathwise SHEATHWISE_PG_PORT
migrate_and_seed --seed
start_maildev "$SMTP_PORT_DEV" "$MAIL_WEB_PORT"
start_s3 "$S3_PORT" "$ROOT/.data/s3"

# The session secret is made once and kept beside the data, so sign-ins survive restarts.
SECRET_FILE="$ROOT/.data/auth-secret"
[ -s "$SECRET_FILE" ] || node -e "console.log(require('crypto').randomBytes(32).toString('hex'))" >"$SECRET_FILE"
export AUTH_SECRET="$(cat "$SECRET_FILE")"

build_app
start_server
log "Sheathwise is running:  http://127.0.0.1:$SHEATHWISE_PORT   (demo accounts: see README.md)"
log "Mail inbox:             http://127.0.0.1:$MAIL_WEB_PORT"
log "Press Ctrl-C to stop."
wait "$SERVER_PID"
