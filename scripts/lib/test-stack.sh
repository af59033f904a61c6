#!/usr/bin/env bash
# The throw-away stores of a test run, shared by scripts/test.sh (npm test) and
# scripts/lib/with-test-stack.sh (npm run bench:ui): a fresh database $DB_NAME in the project's
# PostgreSQL cluster, a Redis without persistence on $REDIS_TEST_PORT (flushed first), the app and
# mail ports exported for the tests, migrations applied and the app built if a source changed.
# Whatever this started is stopped again when the calling script exits.
# Needs services.sh sourced and APP_PORT, MAIL_PORT and DB_NAME set.
start_test_stack() {
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
}
