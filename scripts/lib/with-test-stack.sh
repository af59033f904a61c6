#!/usr/bin/env bash
# Runs one command against the throw-away stores scripts/test.sh provisions (a fresh database
# sheaf_test_<pid>, a Redis without persistence on the test port, the test app and mail ports
# exported as TEST_APP_URL / SMTP_URL), building the app first if a source changed. The command
# starts the app itself (tests/support/stack.ts). Used by `npm run bench:ui`:
#   bash scripts/lib/with-test-stack.sh node_modules/.bin/tsx scripts/bench-ui.ts
source "$(dirname "$0")/services.sh"
source "$(dirname "$0")/test-stack.sh"
cd "$ROOT"

APP_PORT="${SHEAF_TEST_APP_PORT:-3100}"
MAIL_PORT="${SHEAF_TEST_MAIL_PORT:-2526}"
DB_NAME="sheaf_test_$$"

ensure_packages with-browser
ensure_node_modules

start_test_stack

"$@"
