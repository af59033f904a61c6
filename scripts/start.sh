#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, Redis and the mail fake on loopback,
# migrate, seed, build, then serve http://127.0.0.1:3000 with the worker, both supervised
# (scripts/supervise.ts restarts either after a crash). Ctrl-C stops the app and the worker;
# `bash scripts/stop.sh` stops the services too. Prints the Outbox link with its
# key (.data/outbox-key).
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
# The server answers for APP_ORIGIN's host only, plus these (comma-separated host:port).
export SHEAF_ALLOWED_HOSTS="${SHEAF_ALLOWED_HOSTS:-localhost:$APP_PORT}"

# The Outbox shows every account's mail, so all of it needs a key: made once, kept in
# .data/outbox-key (readable by this user only) and reused on later starts. Only the app gets it.
OUTBOX_KEY_FILE="$DATA/outbox-key"
if [ -z "${SHEAF_OUTBOX_KEY:-}" ]; then
  if [ ! -s "$OUTBOX_KEY_FILE" ]; then
    mkdir -p "$DATA"
    (umask 077 && node -e "process.stdout.write(require('node:crypto').randomBytes(32).toString('base64url'))" >"$OUTBOX_KEY_FILE")
    log "made the Outbox key (.data/outbox-key)"
  fi
  SHEAF_OUTBOX_KEY="$(cat "$OUTBOX_KEY_FILE")"
fi

node_modules/.bin/tsx scripts/migrate.ts
node_modules/.bin/tsx scripts/seed.ts
mail_start "$MAIL_PORT" mail-fake
build_if_needed

# The app and the worker run under scripts/supervise.ts: either one that crashes is restarted with
# a growing pause (1 s, 2 s, 4 s … 30 s) while the other keeps serving, and the console says so.
# Ctrl-C (or SIGTERM) stops both.
supervisor=''
stop_children() {
  trap - INT TERM EXIT
  if [ -n "$supervisor" ]; then
    kill -TERM "$supervisor" 2>/dev/null || true
    wait "$supervisor" 2>/dev/null || true
  fi
  log 'app and worker stopped (services keep running; bash scripts/stop.sh stops them)'
}
trap stop_children INT TERM EXIT

HOST=127.0.0.1 PORT="$APP_PORT" SHEAF_OUTBOX_KEY="$SHEAF_OUTBOX_KEY" node --import tsx scripts/supervise.ts &
supervisor=$!
wait_for_health "$APP_ORIGIN"
log "Sheaf is ready on $APP_ORIGIN. Ctrl-C to stop."
log "Outbox, the mail of every local account (for you only, do not share the link):"
log "  $APP_ORIGIN/outbox?key=$SHEAF_OUTBOX_KEY"
wait "$supervisor" || true
