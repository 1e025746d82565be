#!/usr/bin/env bash
# `npm start`: everything from a fresh machine to a running Lariat (database, migrations, demo
# workspace, built client, the API). Safe to run twice; Ctrl-C stops what it started.
source "$(dirname "$0")/lib.sh"

export NODE_ENV="${NODE_ENV:-development}"
prepare_app
if [ "${LARIAT_SKIP_BUILD:-0}" != 1 ]; then
  log "building the client"
  npx vite build --logLevel warn
fi
npx tsx server/main.ts &
# One fit worker beside the API (more: `npm run worker` anywhere that reaches the same PostgreSQL).
npx tsx server/worker/main.ts &
wait
