#!/usr/bin/env bash
# npm run bench:register: the built server on a throwaway database with 5,000 register assets in one
# project, loaded with autocannon on loopback. Prints figures and the p95 target; asserts nothing.
set -euo pipefail
source "$(dirname "$0")/services.sh"

export SHEATHWISE_PORT="${SHEATHWISE_BENCH_PORT:-4395}"
PG_PORT="${SHEATHWISE_BENCH_PG_PORT:-55495}"
TMP="$(mktemp -d /tmp/sheathwise-bench-register.XXXXXX)"
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
node_modules/.bin/tsx bench/register.bench.ts
