#!/usr/bin/env bash
# npm test: the same provisioning as npm start, into throw-away stores: a fresh database
# sheaf_test_<pid> in the project's PostgreSQL cluster (dropped at the end), a Redis without
# persistence on port 63791 (flushed first), a mail fake on port 2526 and the app on port 3100.
# Lint and typecheck run first and fail the run on any error.
# Then the whole vitest suite (unit, integration, browser). Extra arguments go to vitest, e.g.
#   bash scripts/test.sh --project integration tests/integration/auth.test.ts
# Services this script started are stopped again at the end.
source "$(dirname "$0")/lib/services.sh"
source "$(dirname "$0")/lib/test-stack.sh"
cd "$ROOT"
started_at=$(date +%s)

APP_PORT="${SHEAF_TEST_APP_PORT:-3100}"
MAIL_PORT="${SHEAF_TEST_MAIL_PORT:-2526}"
DB_NAME="sheaf_test_$$"

ensure_packages with-browser
ensure_node_modules

# Static checks first: a lint error (warnings are only shown) or a type error fails the run
# before any service starts.
# SHEAF_SKIP_CHECKS=1 skips them while iterating on part of the suite (never in CI).
if [ "${SHEAF_SKIP_CHECKS:-0}" != 1 ]; then
  [ -f .nuxt/eslint.config.mjs ] || node_modules/.bin/nuxt prepare >/dev/null
  log 'linting (npm run lint)'
  npm run -s lint || die 'lint failed (npm run lint)'
  log 'type-checking (nuxt typecheck)'
  node_modules/.bin/nuxt typecheck || die 'type errors (nuxt typecheck)'
fi

start_test_stack

log "running vitest (unit, integration, browser)"
set +e
node_modules/.bin/vitest run --config tests/vitest.config.ts "$@" 2>&1 | tee "$DATA/test-vitest.log"
status=${PIPESTATUS[0]}
set -e
summary=$(sed 's/\x1b\[[0-9;]*m//g' "$DATA/test-vitest.log" | grep -E '^\s+(Test Files|Tests)\s' | tail -n 2 | sed 's/^ *//' | paste -sd ';' - | sed 's/;/ · /')
log "summary: ${summary:-no vitest summary (see .data/test-vitest.log)} · $(( $(date +%s) - started_at )) s in all"
exit "$status"
