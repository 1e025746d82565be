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
log "tests"
results="$LARIAT_STATE/test-results.json"
rm -f "$results"
status=0
npx vitest run --reporter=default --reporter=json --outputFile.json="$results" "$@" || status=$?
# One plain closing line for CI: "N passed, N failed[, N skipped]".
if [ -s "$results" ]; then
  node -e 'const r = JSON.parse(require("fs").readFileSync(process.argv[1], "utf8"));
    const skipped = r.numPendingTests + r.numTodoTests;
    console.log(`${r.numPassedTests} passed, ${r.numFailedTests} failed` + (skipped ? `, ${skipped} skipped` : ""));' "$results"
fi
exit "$status"
