#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, Redis and the mail fake on loopback,
# migrate, seed, build, then serve http://127.0.0.1:3000 with the worker. Ctrl-C stops the app
# and the worker; `bash scripts/stop.sh` stops the services too.
source "$(dirname "$0")/lib/services.sh"
cd "$ROOT"

APP_PORT="${PORT:-3000}"
MAIL_PORT="${SHEAF_MAIL_PORT:-2525}"
ensure_packages
ensure_node_modules
pg_start
pg_create_db sheaf
redis_start "$REDIS_PORT" persistent

export DATABASE_URL="$(pg_url sheaf)"
export REDIS_URL="redis://127.0.0.1:$REDIS_PORT/0"
export SMTP_URL="smtp://127.0.0.1:$MAIL_PORT"
export SHEAF_MAIL_FAKE=1
export APP_ORIGIN="http://127.0.0.1:$APP_PORT"

node_modules/.bin/tsx scripts/migrate.ts
node_modules/.bin/tsx scripts/seed.ts
mail_start "$MAIL_PORT" mail-fake
build_if_needed

pids=()
stop_children() {
  trap - INT TERM EXIT
  [ ${#pids[@]} -gt 0 ] && kill -TERM "${pids[@]}" 2>/dev/null || true
  wait "${pids[@]}" 2>/dev/null || true
  log 'app and worker stopped (services keep running; bash scripts/stop.sh stops them)'
}
trap stop_children INT TERM EXIT

HOST=127.0.0.1 PORT="$APP_PORT" node .output/server/index.mjs &
pids+=($!)
node_modules/.bin/tsx workers/index.ts &
pids+=($!)
wait_for_health "$APP_ORIGIN"
log "Sheaf is ready on $APP_ORIGIN (Outbox: $APP_ORIGIN/outbox). Ctrl-C to stop."
wait -n "${pids[@]}" || true
