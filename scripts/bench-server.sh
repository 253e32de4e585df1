#!/usr/bin/env bash
# npm run bench:http / bench:register: the built server on a throwaway database (the demo
# data), then the named benchmark (bench/http.bench.ts seeds 10,000 studies, bench/register.bench.ts
# 5,000 register assets) loads it with autocannon on loopback. Prints figures; asserts nothing.
# BENCH_HOLD=1 keeps the services up afterwards, to rerun the benchmark (it seeds only once).
# Usage: scripts/bench-server.sh bench/<name>.bench.ts
set -euo pipefail
BENCH="${1:?name the benchmark, e.g. bench/http.bench.ts}"
source "$(dirname "$0")/services.sh"

export SHEATHWISE_PORT="${SHEATHWISE_BENCH_PORT:-4395}"
PG_PORT="${SHEATHWISE_BENCH_PG_PORT:-55495}"
TMP="$(mktemp -d /tmp/sheathwise-bench.XXXXXX)"
chmod 755 "$TMP"
export BUILD_LOG="$TMP/build.log" SERVER_LOG="$TMP/server.log"
cleanup() { stop_started; rm -rf "$TMP"; }
trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_node_modules
ensure_fonts
start_postgres "$TMP/pg" "$PG_PORT" sheathwise_bench
migrate_and_seed --seed
start_maildev "${SHEATHWISE_BENCH_SMTP_PORT:-1095}" "${SHEATHWISE_BENCH_MAIL_WEB_PORT:-1096}"
start_s3 "${SHEATHWISE_BENCH_S3_PORT:-4597}" "$TMP/s3"
export AUTH_SECRET="bench-secret-$(date +%s)-not-for-production"
build_app
start_server
export APP_URL="http://127.0.0.1:$SHEATHWISE_PORT"
cd "$ROOT"
node_modules/.bin/tsx "$BENCH"
if [ -n "${BENCH_HOLD:-}" ]; then
  # Keeps the seeded server up for more runs or a profiler; Ctrl-C stops everything.
  log "holding; rerun with: APP_URL=$APP_URL DATABASE_URL=$DATABASE_URL MAILDEV_WEB_PORT=$MAILDEV_WEB_PORT node_modules/.bin/tsx $BENCH"
  sleep infinity & wait $!
fi
