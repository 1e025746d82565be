#!/usr/bin/env bash
# `npm start`: everything from a fresh machine to a running Lariat (database, migrations, demo
# workspace, built client, API with one fit worker). Safe to run twice; Ctrl-C stops what it started.
source "$(dirname "$0")/lib.sh"

ensure_node_modules
ensure_cluster
ensure_database "${LARIAT_DB_NAME:-lariat}"
export DATABASE_URL="${DATABASE_URL:-$(database_url "${LARIAT_DB_NAME:-lariat}")}"
export NODE_ENV="${NODE_ENV:-development}"

cleanup() {
  if [ -n "${SERVER_PID:-}" ]; then kill "$SERVER_PID" 2>/dev/null || true; wait "$SERVER_PID" 2>/dev/null || true; fi
  if [ "${LARIAT_PG_STARTED:-0}" = 1 ]; then log "stopping PostgreSQL"; stop_cluster; fi
  return 0
}
trap cleanup EXIT
trap 'exit 130' INT TERM

cd "$LARIAT_ROOT"
npx tsx server/db/migrate.ts
npx tsx server/seed/demo.ts
if [ "${LARIAT_SKIP_BUILD:-0}" != 1 ]; then
  log "building the client"
  npx vite build --logLevel warn
fi
npx tsx server/main.ts &
SERVER_PID=$!
wait "$SERVER_PID"
