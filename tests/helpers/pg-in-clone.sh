#!/usr/bin/env bash
# pg-in-clone.sh CLONE PORT: what `npm start` does for the database, run from the clone's own
# scripts/services.sh by whoever calls this (root, or a user without privileges): choose the
# cluster folder, start the cluster on PORT, ask it `select 1`, stop it. Prints the start-up log
# and `result KEY=VALUE` lines for tests/integration/clone-anywhere.test.ts.
set -euo pipefail
clone="$1" port="$2"
source "$clone/scripts/services.sh"
trap 'stop_postgres || true' EXIT

choose_pg_dir
echo "result pg_dir=$PG_DIR"
start_postgres "$PG_DIR" "$port" sheathwise SHEATHWISE_PG_PORT
echo "result select=$("$PG_BIN/psql" -X -h 127.0.0.1 -p "$port" -U app -d sheathwise -tAc 'select 1')"
echo "result server_user=$(stat -c %U "/proc/$(head -1 "$PG_DIR/postmaster.pid")")"
stop_postgres
if pg_running "$PG_DIR"; then echo "result stopped=no"; else echo "result stopped=yes"; fi
