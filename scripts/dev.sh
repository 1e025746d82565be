#!/usr/bin/env bash
# `npm run dev`: the API (restarting on change) plus Vite's hot-reloading client, same database as `npm start`.
source "$(dirname "$0")/lib.sh"

ensure_node_modules
ensure_cluster
ensure_database "${LARIAT_DB_NAME:-lariat}"
export DATABASE_URL="${DATABASE_URL:-$(database_url "${LARIAT_DB_NAME:-lariat}")}"
export NODE_ENV=development LARIAT_SERVE_CLIENT=0

cleanup() {
  kill $(jobs -p) 2>/dev/null || true
  if [ "${LARIAT_PG_STARTED:-0}" = 1 ]; then stop_cluster; fi
  return 0
}
trap cleanup EXIT
trap 'exit 130' INT TERM

cd "$LARIAT_ROOT"
npx tsx server/db/migrate.ts
npx tsx server/seed/demo.ts
npx tsx watch server/main.ts &
npx vite &
wait
