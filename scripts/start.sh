#!/usr/bin/env bash
# shellcheck disable=SC2317 # (functions below run from traps)
# npm start: install dependencies, start our own PostgreSQL (.data/pg on 127.0.0.1:54329),
# migrate + seed the "sheetsmith" database, build the client, run the server in the foreground.
# Ctrl-C stops the server and the cluster (when this script started it).
#
# Environment: PORT (app port, default 5173), HOST (default 127.0.0.1), NODE_ENV (default
# development), DATABASE_URL (when set, our cluster is not used at all).
set -euo pipefail

# shellcheck source=scripts/lib.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$SHEETSMITH_ROOT"

SERVER_PID=""
SERVER_GROUP=0   # 1 when the server runs in its own process group (killed as a whole)

# True while any live (non-zombie) process is in process group $1.
_group_alive() {
  local stat_file line rest
  local -a fields
  for stat_file in /proc/[0-9]*/stat; do
    read -r line <"$stat_file" 2>/dev/null || continue
    rest=${line##*) }
    read -ra fields <<<"$rest"
    [[ ${fields[0]} != Z && ${fields[2]} == "$1" ]] && return 0
  done
  return 1
}

_server_alive() {
  [[ -n $SERVER_PID ]] || return 1
  if ((SERVER_GROUP)); then _group_alive "$SERVER_PID"; else kill -0 "$SERVER_PID" 2>/dev/null; fi
}

stop_server() {
  local i
  [[ -n $SERVER_PID ]] || return 0
  if _server_alive; then
    say "stopping the server"
    if ((SERVER_GROUP)); then kill -TERM -- "-$SERVER_PID" 2>/dev/null || true; else kill -TERM "$SERVER_PID" 2>/dev/null || true; fi
    for ((i = 0; i < 100; i++)); do _server_alive || break; sleep 0.1; done
    if _server_alive; then
      warn "the server did not stop within 10 s: killing it"
      if ((SERVER_GROUP)); then kill -KILL -- "-$SERVER_PID" 2>/dev/null || true; else kill -KILL "$SERVER_PID" 2>/dev/null || true; fi
    fi
  fi
  wait "$SERVER_PID" 2>/dev/null || true
  SERVER_PID=""
}

on_exit() {
  local status=$?
  trap '' INT TERM HUP   # finish cleaning up even on a second Ctrl-C
  trap - EXIT
  stop_server
  stop_started_clusters
  exit "$status"
}
trap on_exit EXIT
trap 'echo; say "interrupted"; exit 130' INT
trap 'say "terminated"; exit 143' TERM
trap 'exit 129' HUP

export NODE_ENV=${NODE_ENV:-development}
export PORT=${PORT:-$SHEETSMITH_APP_PORT_DEFAULT}
APP_HOST=${HOST:-127.0.0.1}
case $APP_HOST in 0.0.0.0 | :: | '[::]') APP_HOST=127.0.0.1 ;; esac
APP_URL_SHOWN="http://$APP_HOST:$PORT"

if (: <"/dev/tcp/$APP_HOST/$PORT") 2>/dev/null; then
  die "$APP_HOST:$PORT is already in use (another npm start?); stop it or run with PORT=<other port> npm start"
fi

ensure_node_modules

if [[ -n ${DATABASE_URL:-} ]]; then
  say "DATABASE_URL is set: using it, not starting our PostgreSQL cluster"
else
  ensure_postgres
  start_cluster .data/pg "$SHEETSMITH_DEV_PG_PORT"
  ensure_database "$SHEETSMITH_DEV_PG_PORT" sheetsmith
  export DATABASE_URL="postgres://$SHEETSMITH_DB_USER@127.0.0.1:$SHEETSMITH_DEV_PG_PORT/sheetsmith"
fi

say "migrating the database"
node_modules/.bin/tsx scripts/migrate.ts

say "seeding demo data"
mkdir -p .data
node_modules/.bin/tsx scripts/seed.ts | tee .data/seed-output.txt

# The client is always built for production (the server serves dist/ as the shipped product).
say "building the client (vite build)"
NODE_ENV=production node_modules/.bin/vite build

say "starting the server (node_modules/.bin/tsx server/index.ts, NODE_ENV=$NODE_ENV)"
if command -v setsid >/dev/null 2>&1; then
  # Own process group, so stopping it also stops tsx's child node process.
  setsid node_modules/.bin/tsx server/index.ts &
  SERVER_GROUP=1
else
  node_modules/.bin/tsx server/index.ts &
fi
SERVER_PID=$!

_health_ok() {
  local url="http://$APP_HOST:$PORT/api/health"
  if command -v curl >/dev/null 2>&1; then
    curl -fsS -o /dev/null --max-time 2 "$url" 2>/dev/null
  else
    node -e 'fetch(process.argv[1], { signal: AbortSignal.timeout(2000) }).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "$url"
  fi
}

deadline=$((SECONDS + 120))
until _health_ok; do
  if ! kill -0 "$SERVER_PID" 2>/dev/null; then
    status=0
    wait "$SERVER_PID" || status=$?
    die "the server exited (status $status) before answering /api/health"
  fi
  if ((SECONDS >= deadline)); then
    warn "the server has not answered http://$APP_HOST:$PORT/api/health after 120 s; still waiting on it"
    break
  fi
  sleep 0.5
done

echo
say "------------------------------------------------------------"
say "Sheetsmith is running at $APP_URL_SHOWN"
if [[ -s .data/seed-output.txt ]] && (($(wc -l <.data/seed-output.txt) <= 25)); then
  cat .data/seed-output.txt   # scripts/seed.ts prints the demo sign-ins
elif [[ -s .data/seed-output.txt ]]; then
  say "Demo sign-ins: see the seed output above (saved in .data/seed-output.txt)"
fi
say "Press Ctrl-C to stop."
say "------------------------------------------------------------"
echo

# A Ctrl-C/TERM interrupts this wait and runs the traps above.
status=0
wait "$SERVER_PID" || status=$?
say "the server exited (status $status)"   # on_exit still stops anything left in its process group
exit "$status"
