#!/usr/bin/env bash
# `npm run dev`: the API (restarting on change) plus Vite's hot-reloading client, same database as `npm start`.
source "$(dirname "$0")/lib.sh"

export NODE_ENV=development LARIAT_SERVE_CLIENT=0
prepare_app
npx tsx watch server/main.ts &
npx tsx server/worker/main.ts &
log "the client with hot reload: http://127.0.0.1:5173 (API calls go through to port ${LARIAT_PORT:-5180})"
npx vite --host 127.0.0.1 --strictPort &
wait
