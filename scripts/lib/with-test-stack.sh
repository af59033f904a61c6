#!/usr/bin/env bash
# Runs one command against the throw-away stores scripts/test.sh provisions (a fresh database
# sheaf_test_<pid>, a Redis without persistence on the test port, the test app and mail ports
# exported as TEST_APP_URL / SMTP_URL), building the app first if a source changed. The command
# starts the app itself (tests/support/stack.ts). Used by `npm run bench:ui`:
#   bash scripts/lib/with-test-stack.sh node_modules/.bin/tsx scripts/bench-ui.ts
source "$(dirname "$0")/services.sh"
cd "$ROOT"

APP_PORT="${SHEAF_TEST_APP_PORT:-3100}"
MAIL_PORT="${SHEAF_TEST_MAIL_PORT:-2526}"
DB_NAME="sheaf_test_$$"

ensure_packages with-browser
ensure_node_modules

pg_was_running=0
PGDATA_DIR="$(pg_datadir)"
as_pg "$(pg_bin)/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1 && pg_was_running=1
redis_was_running=0
redis_running "$REDIS_TEST_PORT" && redis_was_running=1

cleanup() {
  local rc=$?
  trap - EXIT INT TERM
  pg_drop_db "$DB_NAME" >/dev/null 2>&1 || true
  [ "$redis_was_running" = 1 ] || redis_stop "$REDIS_TEST_PORT"
  [ "$pg_was_running" = 1 ] || pg_stop
  exit "$rc"
}
trap cleanup EXIT INT TERM

pg_start
pg_create_db "$DB_NAME"
redis_start "$REDIS_TEST_PORT" ephemeral
redis-cli -h 127.0.0.1 -p "$REDIS_TEST_PORT" flushall >/dev/null

export DATABASE_URL="$(pg_url "$DB_NAME")"
export REDIS_URL="redis://127.0.0.1:$REDIS_TEST_PORT/0"
export SMTP_URL="smtp://127.0.0.1:$MAIL_PORT"
export SHEAF_MAIL_FAKE=1
export APP_ORIGIN="http://127.0.0.1:$APP_PORT"
export TEST_APP_URL="$APP_ORIGIN"
export SHEAF_TRUST_PROXY=1
export SHEAF_OUTBOX_KEY="${SHEAF_OUTBOX_KEY:-$(node -e "process.stdout.write(require('node:crypto').randomBytes(32).toString('base64url'))")}"

node_modules/.bin/tsx scripts/migrate.ts
build_if_needed

"$@"
