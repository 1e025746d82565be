#!/usr/bin/env bash
# `npm test`: its own set-up (dependencies, PostgreSQL, chromium), then typecheck, lint and the
# vitest projects: unit (engine and pure code), api (supertest on real PostgreSQL), e2e (chromium).
source "$(dirname "$0")/lib.sh"

ensure_node_modules
ensure_chromium
ensure_cluster
export LARIAT_TEST_DATABASE_ADMIN_URL="$(database_url postgres)"
export NODE_ENV=test

trap stop_started EXIT

cd "$LARIAT_ROOT"
log "typecheck"; npx tsc -p tsconfig.json --noEmit
log "lint"; npx eslint . --max-warnings 0
log "client build (for the browser tests)"; npx vite build --logLevel warn
log "tests"; npx vitest run "$@"
