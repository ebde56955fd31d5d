#!/usr/bin/env bash
# shellcheck disable=SC2317 # (functions below run from traps)
# npm test [-- VITEST ARGS]: install dependencies, start our own test PostgreSQL (.data/test-pg on
# 127.0.0.1:54339), recreate the throw-away "sheetsmith_test" database, migrate it, build the
# client (the e2e tests use dist/), then `vitest run` with the extra arguments.
# Exits with vitest's status; stops the test cluster when this script started it.
set -euo pipefail

# shellcheck source=scripts/lib.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$SHEETSMITH_ROOT"

TEST_STARTED_AT=$SECONDS

on_exit() {
  local status=$?
  trap '' INT TERM HUP   # finish cleaning up even on a second Ctrl-C
  trap - EXIT
  stop_started_clusters
  say "npm test finished in $(format_duration $((SECONDS - TEST_STARTED_AT))) (exit status $status)"
  exit "$status"
}
trap on_exit EXIT
trap 'echo; say "interrupted"; exit 130' INT
trap 'say "terminated"; exit 143' TERM
trap 'exit 129' HUP

# Runs in the same checkout share the test cluster, the database and dist/: one at a time.
acquire_lock test

ensure_node_modules
ensure_postgres
ensure_chromium
# Throw-away data: trade crash safety for speed.
start_cluster .data/test-pg "$SHEETSMITH_TEST_PG_PORT" fsync=off synchronous_commit=off full_page_writes=off
recreate_database "$SHEETSMITH_TEST_PG_PORT" sheetsmith_test

export NODE_ENV=test
export DATABASE_URL="postgres://$SHEETSMITH_DB_USER@127.0.0.1:$SHEETSMITH_TEST_PG_PORT/sheetsmith_test"
export CHROMIUM_PATH=${CHROMIUM_PATH:-/usr/bin/chromium}

say "migrating sheetsmith_test"
node_modules/.bin/tsx scripts/migrate.ts 9>&-

# The e2e tests run against the production build of the client, as shipped.
say "building the client (vite build)"
NODE_ENV=production node_modules/.bin/vite build 9>&-

say "vitest run $*"
status=0
node_modules/.bin/vitest run "$@" 9>&- || status=$?
exit "$status"
