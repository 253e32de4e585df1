#!/usr/bin/env bash
# npm test: the whole suite against a throwaway database, mail catcher and built server.
set -euo pipefail
source "$(dirname "$0")/services.sh"

export SHEATHWISE_PORT="${SHEATHWISE_TEST_PORT:-4391}"
PG_PORT="${SHEATHWISE_TEST_PG_PORT:-55491}"
export TEST_ARTIFACTS="$ROOT/test-artifacts"
mkdir -p "$TEST_ARTIFACTS"
export BUILD_LOG="$TEST_ARTIFACTS/build.log" SERVER_LOG="$TEST_ARTIFACTS/server.log" MAILDEV_LOG="$TEST_ARTIFACTS/maildev.log" S3_LOG="$TEST_ARTIFACTS/s3.log"

TMP_PG="$(mktemp -d /tmp/sheathwise-test-pg.XXXXXX)"
chmod 755 "$TMP_PG"
cleanup() { stop_started; rm -rf "$TMP_PG"; }
trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_node_modules
ensure_fonts
(cd "$ROOT" && node scripts/typecheck.mjs)
ensure_chromium
start_postgres "$TMP_PG/data" "$PG_PORT" sheathwise_test
# The reliability tests stop and start this cluster under load.
export TEST_PG_DATA="$PG_DATA" TEST_PG_PORT="$PG_PORT"
migrate_and_seed --seed
start_maildev "${SHEATHWISE_TEST_SMTP_PORT:-1091}" "${SHEATHWISE_TEST_MAIL_WEB_PORT:-1092}"
start_s3 "${SHEATHWISE_TEST_S3_PORT:-4599}" "$TMP_PG/s3"
export AUTH_SECRET="test-secret-$(date +%s)-not-for-production"
export SIGN_IN_MAX_FAILURES=3 SIGN_IN_LOCK_SECONDS=60
build_app
start_server
export TEST_SERVER_PID="$SERVER_PID"
export APP_URL="http://127.0.0.1:$SHEATHWISE_PORT"

cd "$ROOT"
node_modules/.bin/vitest run --reporter=default --reporter=json --reporter=./tests/reporters/validation-reporter.ts --outputFile.json="$TEST_ARTIFACTS/vitest.json" "$@" && status=0 || status=$?
node scripts/print-totals.mjs "$TEST_ARTIFACTS/vitest.json" || status=1
exit "$status"
