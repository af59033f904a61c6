#!/usr/bin/env bash
# Stop the services npm start and npm test started: mail fakes, both Redis servers, PostgreSQL.
source "$(dirname "$0")/lib/services.sh"
mail_stop mail-fake
mail_stop mail-fake-test
redis_stop "$REDIS_PORT"
redis_stop "$REDIS_TEST_PORT"
command -v pg_ctl >/dev/null || compgen -G '/usr/lib/postgresql/*/bin/pg_ctl' >/dev/null && pg_stop
log 'services stopped'
